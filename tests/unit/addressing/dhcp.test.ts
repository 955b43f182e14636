import { describe, expect, it } from 'vitest';
import { DHCP_CLIENT_PORT, DHCP_SERVER_PORT, dhcpTimersS } from '../../../shared/addressing/dhcp';

describe('DHCP timers', () => {
  it('renews at 0.5 and rebinds at 0.875 of the lease', () => {
    expect(dhcpTimersS(86400)).toEqual({ t1S: 43200, t2S: 75600 }); // RFC 2131 §4.4.5
    expect(dhcpTimersS(3600)).toEqual({ t1S: 1800, t2S: 3150 }); // RFC 2131 §4.4.5
  });
  it('uses ports 67 and 68', () => {
    expect([DHCP_SERVER_PORT, DHCP_CLIENT_PORT]).toEqual([67, 68]); // RFC 2131 §4.1
  });
  it('refuses a lease that is not positive', () => {
    expect(() => dhcpTimersS(0)).toThrow(RangeError);
    expect(() => dhcpTimersS(Number.POSITIVE_INFINITY)).toThrow(RangeError);
  });
});
