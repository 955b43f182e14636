import { allocateSubnets, describeSubnet, parseCidr, rangeOf, usableHosts, type SubnetDescription } from './cidr';
import { allocateSubnets6, describeSubnet6, ipv6PoolWarnings, type Subnet6Description } from './ipv6';

// Private IPv4 space: RFC 1918 (10/8, 172.16/12, 192.168/16) and RFC 6598 shared address space (100.64/10).
const PRIVATE_V4 = ['10.0.0.0/8', '172.16.0.0/12', '192.168.0.0/16', '100.64.0.0/10'].map((c) => rangeOf(parseCidr(c)));

export function isPrivateIpv4Pool(pool: string): boolean {
  const [lo, hi] = rangeOf(parseCidr(pool));
  return PRIVATE_V4.some(([a, b]) => lo >= a && hi <= b);
}

/** Headroom on expected DHCP clients: phones and visitors come and go faster than leases expire (common practice, no source). */
export const DHCP_HEADROOM = 1.5;

export interface DhcpSizing {
  expectedClients: number;
  /** Expected clients × headroom, plus the gateway. */
  addressesNeeded: number;
  /** Longest IPv4 prefix whose usable hosts (RFC 4632) cover the need. */
  suggestedPrefixLength: number;
  fitsRequested: boolean;
}

// Usable hosts per prefix, RFC 4632 (2^(32−n) − 2; /31 two, RFC 3021): the longest prefix that still holds the need.
export function dhcpSizing(expectedClients: number, requestedPrefixLength: number): DhcpSizing {
  const addressesNeeded = Math.ceil(expectedClients * DHCP_HEADROOM) + 1;
  let suggestedPrefixLength = 30;
  while (suggestedPrefixLength > 1 && usableHosts(suggestedPrefixLength) < addressesNeeded) suggestedPrefixLength--;
  return { expectedClients, addressesNeeded, suggestedPrefixLength, fitsRequested: usableHosts(requestedPrefixLength) >= addressesNeeded };
}

export interface AddressPlanInput {
  pool: string;
  prefixLength: number;
  count: number;
  taken?: string[];
  expectedClients?: number;
}
export interface AddressPlanAnswer {
  subnets: (SubnetDescription | Subnet6Description)[];
  warnings: string[];
  dhcp?: DhcpSizing;
}

/** The address-plan answer (API.md), IPv4 or IPv6 by the pool's form. */
export function planAddressPool(input: AddressPlanInput): AddressPlanAnswer {
  if (input.pool.includes(':')) {
    const subnets = allocateSubnets6(input.pool, input.prefixLength, input.count, input.taken ?? []).map(describeSubnet6);
    const warnings = ipv6PoolWarnings(input.pool);
    if (input.prefixLength !== 64)
      warnings.push(
        `/${input.prefixLength} subnets: SLAAC needs a /64 per link (RFC 4291 §2.5.1, RFC 4862); hand out /64s unless you know you do not need it.`,
      );
    return { subnets, warnings };
  }
  const subnets = allocateSubnets(input.pool, input.prefixLength, input.count, input.taken ?? []).map(describeSubnet);
  const warnings = isPrivateIpv4Pool(input.pool)
    ? []
    : [
        `${input.pool} is neither private (RFC 1918: 10/8, 172.16/12, 192.168/16) nor shared space (RFC 6598: 100.64/10): use it only if it is assigned to your network.`,
      ];
  if (input.expectedClients === undefined) return { subnets, warnings };
  const dhcp = dhcpSizing(input.expectedClients, input.prefixLength);
  if (!dhcp.fitsRequested)
    warnings.push(
      `A /${input.prefixLength} has ${usableHosts(input.prefixLength)} usable addresses; ${input.expectedClients} clients with 50 % headroom and the gateway need ${dhcp.addressesNeeded}: use a /${dhcp.suggestedPrefixLength} or shorter.`,
    );
  return { subnets, warnings, dhcp };
}
