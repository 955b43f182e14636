import { cidrsOverlap, containsAddress, describeSubnet, parseCidr, parseIpv4, rangeOf, type Cidr } from './cidr';
import { PlanningError } from '../radio/errors';

export interface PlannedSubnet {
  /** Who the subnet is for (node name or id), echoed in findings. */
  label: string;
  cidr: string;
  gateway?: string;
  dhcpStart?: string;
  dhcpEnd?: string;
  staticAddresses?: string[];
}
export interface AddressFinding {
  code:
    | 'subnet_overlap'
    | 'gateway_outside_subnet'
    | 'dhcp_outside_subnet'
    | 'dhcp_range_reversed'
    | 'dhcp_includes_gateway'
    | 'dhcp_collides_static'
    | 'static_outside_subnet';
  label: string;
  message: string;
  /** Positions in the checked list of the subnets the finding is about (two for an overlap). */
  subnets: number[];
}

function address(text: string, what: string, label: string): number {
  const a = parseIpv4(text);
  if (a === null) throw new PlanningError(400, 'invalid_address', `${label}: ${what} "${text}" is not an IPv4 address like 10.20.1.1.`);
  return a;
}

/** Overlap, gateway and DHCP-range checks for a whole address plan (RFC 4632 blocks, RFC 2131 pools). */
export function checkAddressPlan(subnets: PlannedSubnet[]): AddressFinding[] {
  const findings: AddressFinding[] = [];
  const parsed: [PlannedSubnet, Cidr][] = subnets.map((s) => [s, parseCidr(s.cidr)]);
  for (let i = 0; i < parsed.length; i++) {
    for (let j = i + 1; j < parsed.length; j++) {
      if (cidrsOverlap(parsed[i][1], parsed[j][1])) {
        const [a, b] = [parsed[i][0], parsed[j][0]];
        const message = `${a.label} (${a.cidr}) overlaps ${b.label} (${b.cidr}); give one of them another block.`;
        findings.push({ code: 'subnet_overlap', label: a.label, message, subnets: [i, j] });
      }
    }
  }
  parsed.forEach(([s, c], i) => findings.push(...checkOne(s, c).map((f) => ({ ...f, subnets: [i] }))));
  return findings;
}

function checkOne(s: PlannedSubnet, c: Cidr): Omit<AddressFinding, 'subnets'>[] {
  const out: Omit<AddressFinding, 'subnets'>[] = [];
  const info = describeSubnet(c);
  const hosts = `${info.firstHost}–${info.lastHost}`;
  const [lo, hi] = rangeOf(c);
  // Network and broadcast addresses are not hosts (except in /31 and /32).
  const isHost = (a: number) => containsAddress(c, a) && (c.prefixLength >= 31 || (a !== lo && a !== hi));
  const gateway = s.gateway === undefined ? undefined : address(s.gateway, 'gateway', s.label);
  if (gateway !== undefined && !isHost(gateway)) {
    out.push({
      code: 'gateway_outside_subnet',
      label: s.label,
      message: `${s.label}: gateway ${s.gateway} is not a host of ${info.cidr} (${hosts}); use ${info.gateway}.`,
    });
  }
  const statics = (s.staticAddresses ?? []).map((t) => [t, address(t, 'static address', s.label)] as const);
  for (const [text, a] of statics) {
    if (!isHost(a))
      out.push({ code: 'static_outside_subnet', label: s.label, message: `${s.label}: static address ${text} is not a host of ${info.cidr} (${hosts}).` });
  }
  if (s.dhcpStart === undefined || s.dhcpEnd === undefined) return out;
  const start = address(s.dhcpStart, 'DHCP start', s.label);
  const end = address(s.dhcpEnd, 'DHCP end', s.label);
  if (start > end) {
    out.push({
      code: 'dhcp_range_reversed',
      label: s.label,
      message: `${s.label}: DHCP range starts (${s.dhcpStart}) after it ends (${s.dhcpEnd}); swap them.`,
    });
    return out;
  }
  if (!isHost(start) || !isHost(end)) {
    out.push({
      code: 'dhcp_outside_subnet',
      label: s.label,
      message: `${s.label}: DHCP range ${s.dhcpStart}–${s.dhcpEnd} crosses the edge of ${info.cidr}; keep it within ${hosts}.`,
    });
  }
  if (gateway !== undefined && gateway >= start && gateway <= end) {
    out.push({
      code: 'dhcp_includes_gateway',
      label: s.label,
      message: `${s.label}: DHCP range ${s.dhcpStart}–${s.dhcpEnd} includes the gateway ${s.gateway}; start the range after it.`,
    });
  }
  const clashes = statics.filter(([, a]) => a >= start && a <= end).map(([t]) => t);
  if (clashes.length > 0) {
    out.push({
      code: 'dhcp_collides_static',
      label: s.label,
      message: `${s.label}: DHCP range ${s.dhcpStart}–${s.dhcpEnd} includes static address${clashes.length > 1 ? 'es' : ''} ${clashes.join(', ')}; move the range or the addresses.`,
    });
  }
  return out;
}
