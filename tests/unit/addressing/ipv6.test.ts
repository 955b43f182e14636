import { describe, expect, it } from 'vitest';
import ipaddr from 'ipaddr.js';
import { allocateSubnets6, describeSubnet6, formatIpv6, ipv6PoolWarnings, parseCidr6, parseIpv6 } from '../../../shared/addressing/ipv6';
import { dhcpSizing, isPrivateIpv4Pool, planAddressPool } from '../../../shared/addressing/poolPlan';
import { PlanningError } from '../../../shared/addressing';

describe('IPv6 text forms (RFC 4291 §2.2 in, RFC 5952 out)', () => {
  it('prints the RFC 5952 examples', () => {
    // RFC 5952 §4.2.1–4.2.3 and §4.3 examples
    expect(formatIpv6(parseIpv6('2001:db8:0:0:0:0:2:1')!)).toBe('2001:db8::2:1');
    expect(formatIpv6(parseIpv6('2001:db8:0:1:1:1:1:1')!)).toBe('2001:db8:0:1:1:1:1:1'); // one zero group is not shortened
    expect(formatIpv6(parseIpv6('2001:0:0:1:0:0:0:1')!)).toBe('2001:0:0:1::1'); // the longest run
    expect(formatIpv6(parseIpv6('2001:db8:0:0:1:0:0:1')!)).toBe('2001:db8::1:0:0:1'); // leftmost on a tie
    expect(formatIpv6(parseIpv6('2001:DB8::AAAA')!)).toBe('2001:db8::aaaa'); // lower case
  });
  it('agrees with ipaddr.js (outside check) and refuses malformed text', () => {
    for (const t of ['::', '::1', 'fd12:3456:789a::', 'fe80::1:2', '1:2:3:4:5:6:7:8', 'fd00:0:0:ff00::']) {
      expect(formatIpv6(parseIpv6(t)!)).toBe(ipaddr.IPv6.parse(t).toRFC5952String());
    }
    for (const bad of ['1::2::3', '12345::', ':::', '1:2:3:4:5:6:7', 'g::1', '1.2.3.4']) expect(parseIpv6(bad)).toBeNull();
  });
  it('refuses a CIDR with host bits set, naming the network', () => {
    expect(() => parseCidr6('fd12:3456:789a::1/48')).toThrow(/host bits set; the network is fd12:3456:789a::\/48/);
    expect(() => parseCidr6('fd12::/129')).toThrow(PlanningError);
  });
});

describe('IPv6 pools (RFC 4193: a /48 per site, /64 subnets)', () => {
  it('splits a ULA /48 into /64s in address order, skipping taken ones', () => {
    const subnets = allocateSubnets6('fd12:3456:789a::/48', 64, 3, ['fd12:3456:789a:1::/64']).map(describeSubnet6);
    expect(subnets.map((s) => s.cidr)).toEqual(['fd12:3456:789a::/64', 'fd12:3456:789a:2::/64', 'fd12:3456:789a:3::/64']);
    expect(subnets[0]).toMatchObject({ netmask: null, broadcast: null, gateway: 'fd12:3456:789a::1', lastHost: 'fd12:3456:789a:0:ffff:ffff:ffff:ffff' });
    expect(subnets[0].usableHosts).toBe(2 ** 64 - 1); // 2^64 minus the subnet-router anycast (RFC 4291 §2.6.1); approximate as a double
    // RFC 4193 §3.1: a /48 holds 2^16 = 65 536 /64s
    expect(allocateSubnets6('fd12:3456:789a::/48', 64, 4096).at(-1)!.network).toBe(parseIpv6('fd12:3456:789a:fff::')!);
    expect(() => allocateSubnets6('fd12:3456:789a::/62', 64, 5)).toThrow(/has only 4 free \/64 subnets/);
  });
  it('warns about pools outside fd00::/8 and an all-zero global ID (RFC 4193 §3.1–3.2)', () => {
    expect(ipv6PoolWarnings('fd12:3456:789a::/48')).toEqual([]);
    expect(ipv6PoolWarnings('fd00::/48')[0]).toMatch(/40 random bits/);
    expect(ipv6PoolWarnings('2001:db8::/48')[0]).toMatch(/not a unique local pool/);
    expect(ipv6PoolWarnings('fc00::/48')[0]).toMatch(/reserved/);
  });
});

describe('IPv4 pool advice and DHCP sizing', () => {
  it('knows RFC 1918 and RFC 6598 space', () => {
    for (const p of ['10.20.0.0/16', '172.31.0.0/16', '192.168.4.0/24', '100.64.0.0/10']) expect(isPrivateIpv4Pool(p)).toBe(true); // RFC 1918, RFC 6598
    for (const p of ['172.32.0.0/16', '8.0.0.0/8', '100.128.0.0/16', '0.0.0.0/0']) expect(isPrivateIpv4Pool(p)).toBe(false);
    expect(planAddressPool({ pool: '198.51.100.0/24', prefixLength: 26, count: 1 }).warnings[0]).toMatch(/neither private \(RFC 1918/);
    expect(planAddressPool({ pool: '10.0.0.0/24', prefixLength: 26, count: 1 }).warnings).toEqual([]);
  });
  it('sizes a DHCP subnet for expected clients with 50 % headroom (common practice) and RFC 4632 host counts', () => {
    // 100 clients × 1.5 + gateway = 151 addresses: a /24 (254 usable, RFC 4632) holds them, a /25 (126) does not
    expect(dhcpSizing(100, 25)).toEqual({ expectedClients: 100, addressesNeeded: 151, suggestedPrefixLength: 24, fitsRequested: false });
    // A /27 has 32 − 2 = 30 usable (RFC 4632): 19 clients need ⌈28.5⌉ + 1 = 30 and fit; 20 need 31 and do not
    expect(dhcpSizing(19, 27)).toMatchObject({ addressesNeeded: 30, suggestedPrefixLength: 27, fitsRequested: true });
    expect(dhcpSizing(20, 27)).toMatchObject({ addressesNeeded: 31, suggestedPrefixLength: 26, fitsRequested: false });
  });
});
