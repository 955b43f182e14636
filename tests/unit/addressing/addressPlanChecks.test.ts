import { describe, expect, it } from 'vitest';
import { checkAddressPlan } from '../../../shared/addressing/addressPlanChecks';
import { PlanningError } from '../../../shared/radio/errors';

const codes = (f: { code: string }[]) => f.map((x) => x.code);

describe('checkAddressPlan', () => {
  it('finds nothing wrong in a clean plan', () => {
    const plan = [
      { label: 'Mill roof', cidr: '10.20.1.0/24', gateway: '10.20.1.1', dhcpStart: '10.20.1.100', dhcpEnd: '10.20.1.200', staticAddresses: ['10.20.1.2'] },
      { label: 'Chapel tower', cidr: '10.20.2.0/24', gateway: '10.20.2.1' },
      { label: 'Backhaul', cidr: '10.20.255.0/31', gateway: '10.20.255.0' },
    ];
    expect(checkAddressPlan(plan)).toEqual([]);
  });
  it('flags overlapping subnets', () => {
    const f = checkAddressPlan([
      { label: 'A', cidr: '10.20.0.0/23' },
      { label: 'B', cidr: '10.20.1.0/24' },
      { label: 'C', cidr: '10.20.2.0/24' },
    ]);
    expect(codes(f)).toEqual(['subnet_overlap']); // RFC 4632: 10.20.0.0/23 spans 10.20.0.0–10.20.1.255
    expect(f[0].message).toMatch(/A \(10\.20\.0\.0\/23\) overlaps B/);
    expect(f[0].subnets).toEqual([0, 1]); // the finding names both subnets by position, so callers filter without reading text
  });
  it('flags a gateway outside the subnet or on its network/broadcast address', () => {
    expect(codes(checkAddressPlan([{ label: 'A', cidr: '10.20.1.0/24', gateway: '10.20.2.1' }]))).toEqual(['gateway_outside_subnet']);
    const f = checkAddressPlan([{ label: 'A', cidr: '10.20.1.0/24', gateway: '10.20.1.255' }]);
    expect(f[0].message).toMatch(/use 10\.20\.1\.1/);
  });
  it('flags a DHCP range crossing the subnet edge, reversed, over the gateway or over statics', () => {
    expect(codes(checkAddressPlan([{ label: 'A', cidr: '10.20.1.0/25', dhcpStart: '10.20.1.100', dhcpEnd: '10.20.1.200' }]))).toEqual(['dhcp_outside_subnet']);
    expect(codes(checkAddressPlan([{ label: 'A', cidr: '10.20.1.0/24', dhcpStart: '10.20.1.100', dhcpEnd: '10.20.1.255' }]))).toEqual(['dhcp_outside_subnet']);
    expect(codes(checkAddressPlan([{ label: 'A', cidr: '10.20.1.0/24', dhcpStart: '10.20.1.200', dhcpEnd: '10.20.1.100' }]))).toEqual(['dhcp_range_reversed']);
    expect(codes(checkAddressPlan([{ label: 'A', cidr: '10.20.1.0/24', gateway: '10.20.1.1', dhcpStart: '10.20.1.1', dhcpEnd: '10.20.1.50' }]))).toEqual([
      'dhcp_includes_gateway',
    ]);
    const f = checkAddressPlan([
      { label: 'A', cidr: '10.20.1.0/24', dhcpStart: '10.20.1.10', dhcpEnd: '10.20.1.50', staticAddresses: ['10.20.1.20', '10.20.1.60', '10.20.1.30'] },
    ]);
    expect(codes(f)).toEqual(['dhcp_collides_static']);
    expect(f[0].message).toMatch(/static addresses 10\.20\.1\.20, 10\.20\.1\.30/);
  });
  it('refuses malformed addresses with a 400', () => {
    expect(() => checkAddressPlan([{ label: 'A', cidr: '10.20.1.0/24', gateway: '10.20.1.01' }])).toThrow(PlanningError);
    expect(() => checkAddressPlan([{ label: 'A', cidr: '10.20.1.1/24' }])).toThrow(/host bits/);
  });
});
