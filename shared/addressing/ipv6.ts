import { PlanningError } from '../radio/errors';

// IPv6 text forms, RFC 4291 §2.2 (input) and RFC 5952 §4 (output: lower case, longest run of zero groups as "::",
// leftmost on a tie, a single zero group not shortened); unique local addresses, RFC 4193 (fd00::/8, /48 per site).

const invalid = (message: string) => new PlanningError(400, 'invalid_cidr', message);
const ALL = (1n << 128n) - 1n;

/** An IPv6 address as a 128-bit integer, or null if the text is not one (no zone ids, no embedded IPv4). */
export function parseIpv6(text: string): bigint | null {
  if (!/^[0-9a-fA-F:]+$/.test(text) || text.length > 39) return null;
  const halves = text.split('::');
  if (halves.length > 2) return null;
  const groups = (s: string) => (s === '' ? [] : s.split(':'));
  const head = groups(halves[0]);
  const tail = halves.length === 2 ? groups(halves[1]) : [];
  const missing = 8 - head.length - tail.length;
  if (halves.length === 1 ? head.length !== 8 : missing < 1) return null;
  const all = [...head, ...Array(halves.length === 2 ? missing : 0).fill('0'), ...tail];
  let value = 0n;
  for (const g of all) {
    if (!/^[0-9a-fA-F]{1,4}$/.test(g)) return null;
    value = (value << 16n) | BigInt(parseInt(g, 16));
  }
  return value;
}

/** RFC 5952 canonical text. */
export function formatIpv6(value: bigint): string {
  const groups = Array.from({ length: 8 }, (_, i) => Number((value >> BigInt(112 - 16 * i)) & 0xffffn));
  let bestStart = -1;
  let bestLen = 1; // a single zero group is not shortened (RFC 5952 §4.2.2)
  for (let i = 0; i < 8;) {
    if (groups[i] !== 0) {
      i++;
      continue;
    }
    let j = i;
    while (j < 8 && groups[j] === 0) j++;
    if (j - i > bestLen) {
      bestStart = i;
      bestLen = j - i;
    }
    i = j;
  }
  const hex = groups.map((g) => g.toString(16));
  if (bestStart < 0) return hex.join(':');
  return `${hex.slice(0, bestStart).join(':')}::${hex.slice(bestStart + bestLen).join(':')}`;
}

export interface Cidr6 {
  network: bigint;
  prefixLength: number;
}

export function parseCidr6(text: string): Cidr6 {
  const m = /^([^/]+)\/(\d{1,3})$/.exec(text.trim());
  if (!m) throw invalid(`"${text}" is not an IPv6 CIDR like fd12:3456:789a::/48.`);
  const address = parseIpv6(m[1]);
  const prefixLength = Number(m[2]);
  if (address === null) throw invalid(`"${m[1]}" is not an IPv6 address (eight groups of up to four hex digits, "::" once at most).`);
  if (prefixLength > 128) throw invalid(`/${prefixLength} is longer than IPv6 allows (0–128).`);
  const hostBits = (1n << BigInt(128 - prefixLength)) - 1n;
  if ((address & hostBits) !== 0n) {
    throw invalid(`${text} has host bits set; the network is ${formatIpv6(address & (ALL ^ hostBits))}/${prefixLength}.`);
  }
  return { network: address, prefixLength };
}

export const formatCidr6 = (c: Cidr6) => `${formatIpv6(c.network)}/${c.prefixLength}`;
const size6 = (prefixLength: number) => 1n << BigInt(128 - prefixLength);

export interface Subnet6Description {
  cidr: string;
  netmask: null;
  gateway: string;
  firstHost: string;
  lastHost: string;
  broadcast: null;
  /** 2^(128 − n) − 1 (the all-zero address is the subnet-router anycast, RFC 4291 §2.6.1); above 2^53 a JSON number is approximate. */
  usableHosts: number;
}

export function describeSubnet6(c: Cidr6): Subnet6Description {
  const last = c.network + size6(c.prefixLength) - 1n;
  const first = c.prefixLength === 128 ? c.network : c.network + 1n;
  return {
    cidr: formatCidr6(c),
    netmask: null,
    gateway: formatIpv6(first),
    firstHost: formatIpv6(first),
    lastHost: formatIpv6(last),
    broadcast: null,
    usableHosts: c.prefixLength >= 127 ? Number(size6(c.prefixLength)) : Number(size6(c.prefixLength) - 1n),
  };
}

/** The first `count` free /prefixLength blocks of an IPv6 pool in address order (a /48 holds 65,536 /64s). */
export function allocateSubnets6(pool: string, prefixLength: number, count: number, taken: string[] = []): Cidr6[] {
  const p = parseCidr6(pool);
  if (prefixLength < p.prefixLength) {
    throw new PlanningError(
      400,
      'prefix_shorter_than_pool',
      `A /${prefixLength} does not fit in the pool ${formatCidr6(p)}; ask for /${p.prefixLength} or longer.`,
    );
  }
  const blocks = taken.map(parseCidr6).map((t) => [t.network, t.network + size6(t.prefixLength) - 1n] as const);
  const size = size6(prefixLength);
  const poolEnd = p.network + size6(p.prefixLength) - 1n;
  const out: Cidr6[] = [];
  let next = p.network;
  while (out.length < count && next + size - 1n <= poolEnd) {
    const end = next + size - 1n;
    const clash = blocks.filter(([lo, hi]) => lo <= end && next <= hi);
    if (clash.length === 0) {
      out.push({ network: next, prefixLength });
      next += size;
    } else {
      const after = clash.reduce((m, [, hi]) => (hi > m ? hi : m), 0n) + 1n;
      next = ((after + size - 1n) / size) * size;
    }
  }
  if (out.length < count) {
    throw new PlanningError(
      409,
      'pool_exhausted',
      `The pool ${formatCidr6(p)} has only ${out.length} free /${prefixLength} subnets; ${count} were asked for. Free some or use a larger pool.`,
    );
  }
  return out;
}

/** Advice on an IPv6 pool: RFC 4193 wants fd00::/8 with a random 40-bit global ID, not fd00::/48. */
export function ipv6PoolWarnings(pool: string): string[] {
  const p = parseCidr6(pool);
  const top8 = Number(p.network >> 120n);
  if (top8 !== 0xfd) {
    return top8 === 0xfc
      ? ['fc00::/8 is reserved for centrally assigned unique local addresses (RFC 4193 §3.1); use an fd…/48 with a random global ID.']
      : [`${formatCidr6(p)} is not a unique local pool (fd00::/8, RFC 4193): use it only if your upstream delegated it to you.`];
  }
  const globalId = (p.network >> 80n) & 0xffffffffffn;
  return globalId === 0n
    ? ['The global ID of this fd…/48 is all zeros: RFC 4193 §3.2 asks for 40 random bits, so two networks that later join do not clash.']
    : [];
}
