// DHCP lease timers, RFC 2131 §4.4.5: renew (T1) at 0.5 × lease, rebind (T2) at 0.875 × lease.
export function dhcpTimersS(leaseS: number): { t1S: number; t2S: number } {
  if (!(leaseS > 0) || !Number.isFinite(leaseS)) throw new RangeError('lease must be a positive number of seconds');
  return { t1S: 0.5 * leaseS, t2S: 0.875 * leaseS };
}

/** RFC 2131 §4.1: servers listen on UDP 67, clients on 68. */
export const DHCP_SERVER_PORT = 67;
export const DHCP_CLIENT_PORT = 68;
