import ipaddr from 'ipaddr.js';
import { PlanningError } from '../radio/errors';

export interface Cidr {
  /** Network address as an unsigned 32-bit integer. */
  network: number;
  prefixLength: number;
}
export interface SubnetDescription {
  cidr: string;
  netmask: string;
  gateway: string;
  firstHost: string;
  lastHost: string;
  broadcast: string | null;
  usableHosts: number;
}

const invalid = (message: string) => new PlanningError(400, 'invalid_cidr', message);

/**
 * Strict dotted-quad IPv4 (RFC 791 §3.2 addresses written as four decimal octets) → unsigned integer, or null.
 * ipaddr.js parses; its four-part-decimal check refuses "010.1.1.1" (octal to some parsers, decimal to others) and short forms.
 */
export function parseIpv4(text: string): number | null {
  if (typeof text !== 'string' || !ipaddr.IPv4.isValidFourPartDecimal(text)) return null;
  return toUint32(ipaddr.IPv4.parse(text));
}

const toUint32 = (address: ipaddr.IPv4) => address.toByteArray().reduce((n, octet) => n * 256 + octet, 0);

export function formatIpv4(address: number): string {
  return ipaddr.fromByteArray([24, 16, 8, 0].map((shift) => (address >>> shift) & 255)).toString();
}

/** Number of addresses in a /n block (RFC 4632: 2^(32−n)). */
export function blockSize(prefixLength: number): number {
  return 2 ** (32 - prefixLength);
}

export function netmaskOf(prefixLength: number): number {
  return toUint32(ipaddr.IPv4.subnetMaskFromPrefixLength(prefixLength));
}

/** Parse "a.b.c.d/n" strictly; host bits set is an error that names the network meant. */
export function parseCidr(text: string): Cidr {
  const match = /^([^/]+)\/(\d{1,2})$/.exec(typeof text === 'string' ? text.trim() : '');
  if (!match) throw invalid(`"${text}" is not an IPv4 CIDR block; write it like 10.20.0.0/16.`);
  const address = parseIpv4(match[1]);
  if (address === null) {
    throw invalid(`"${match[1]}" is not an IPv4 address; use four numbers 0–255 without leading zeros, like 10.20.0.0.`);
  }
  const prefixLength = Number(match[2]);
  if (prefixLength > 32 || (match[2].length > 1 && match[2].startsWith('0'))) throw invalid(`"/${match[2]}" is not a prefix length; use 0–32.`);
  const network = (address & netmaskOf(prefixLength)) >>> 0;
  if (network !== address) {
    throw invalid(`${text} has host bits set; the network is ${formatIpv4(network)}/${prefixLength}.`);
  }
  return { network, prefixLength };
}

export function formatCidr(c: Cidr): string {
  return `${formatIpv4(c.network)}/${c.prefixLength}`;
}

// Usable hosts, RFC 4632: 2^(32−n) − 2; /31 has 2 (RFC 3021, point-to-point) and /32 one.
export function usableHosts(prefixLength: number): number {
  if (prefixLength === 32) return 1;
  if (prefixLength === 31) return 2;
  return blockSize(prefixLength) - 2;
}

/** Host range and broadcast of a block; gateway is the first host by Parapet's convention. */
export function describeSubnet(c: Cidr): SubnetDescription {
  const last = c.network + blockSize(c.prefixLength) - 1;
  const pointToPoint = c.prefixLength >= 31;
  const firstHost = pointToPoint ? c.network : c.network + 1;
  const lastHost = pointToPoint ? last : last - 1;
  return {
    cidr: formatCidr(c),
    netmask: formatIpv4(netmaskOf(c.prefixLength)),
    gateway: formatIpv4(firstHost),
    firstHost: formatIpv4(firstHost),
    lastHost: formatIpv4(lastHost),
    broadcast: pointToPoint ? null : formatIpv4(last),
    usableHosts: usableHosts(c.prefixLength),
  };
}

/** Inclusive address range of a block. */
export function rangeOf(c: Cidr): [number, number] {
  return [c.network, c.network + blockSize(c.prefixLength) - 1];
}

export function cidrsOverlap(a: Cidr, b: Cidr): boolean {
  const [a0, a1] = rangeOf(a);
  const [b0, b1] = rangeOf(b);
  return a0 <= b1 && b0 <= a1;
}

export function containsAddress(c: Cidr, address: number): boolean {
  const [lo, hi] = rangeOf(c);
  return address >= lo && address <= hi;
}

/** The first `count` free /prefixLength blocks of the pool, in address order; any overlap with `taken` counts as taken. */
export function allocateSubnets(pool: string, prefixLength: number, count: number, taken: string[] = []): Cidr[] {
  const p = parseCidr(pool);
  if (!Number.isInteger(prefixLength) || prefixLength < 0 || prefixLength > 32) throw invalid(`prefixLength ${prefixLength} must be a whole number 0–32.`);
  if (prefixLength < p.prefixLength) {
    throw new PlanningError(
      400,
      'prefix_shorter_than_pool',
      `A /${prefixLength} does not fit in the pool ${formatCidr(p)}; ask for /${p.prefixLength} or longer.`,
    );
  }
  const blocks = taken
    .map(parseCidr)
    .map(rangeOf)
    .sort((x, y) => x[0] - y[0]);
  const size = blockSize(prefixLength);
  const [, poolEnd] = rangeOf(p);
  const out: Cidr[] = [];
  let next = p.network;
  while (out.length < count && next + size - 1 <= poolEnd) {
    const end = next + size - 1;
    const clash = blocks.filter(([lo, hi]) => lo <= end && next <= hi);
    if (clash.length === 0) {
      out.push({ network: next, prefixLength });
      next += size;
    } else {
      // Jump past the taken block, to the next boundary of the requested size.
      const after = Math.max(...clash.map(([, hi]) => hi)) + 1;
      next = Math.ceil(after / size) * size;
    }
  }
  if (out.length < count) {
    throw new PlanningError(
      409,
      'pool_exhausted',
      `The pool ${formatCidr(p)} has only ${out.length} free /${prefixLength} subnets; ${count} were asked for. Free some or use a larger pool.`,
    );
  }
  return out;
}

/** The address-plan answer (API.md): the first free subnets with their gateway, hosts and broadcast. */
export function planAddresses(input: { pool: string; prefixLength: number; count: number; taken?: string[] }): { subnets: SubnetDescription[] } {
  return { subnets: allocateSubnets(input.pool, input.prefixLength, input.count, input.taken ?? []).map(describeSubnet) };
}
