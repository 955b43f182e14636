import { describe, expect, it } from 'vitest';
import ipaddr from 'ipaddr.js';
import { Netmask } from 'netmask';
import {
  allocateSubnets,
  describeSubnet,
  formatCidr,
  formatIpv4,
  netmaskOf,
  parseCidr,
  parseIpv4,
  planAddresses,
  usableHosts,
} from '../../../shared/addressing/cidr';
import { PlanningError } from '../../../shared/radio/errors';

const planningError = (fn: () => unknown): PlanningError => {
  try {
    fn();
  } catch (e) {
    if (e instanceof PlanningError) return e;
    throw e;
  }
  throw new Error('expected a PlanningError');
};

describe('strict IPv4 parsing', () => {
  it('accepts four decimal parts 0–255 and agrees with ipaddr.js', () => {
    for (const text of ['0.0.0.0', '10.20.30.40', '255.255.255.255', '100.64.0.1']) {
      expect(ipaddr.IPv4.isValidFourPartDecimal(text)).toBe(true); // outside check
      expect(parseIpv4(text)).toBe(
        ipaddr
          .parse(text)
          .toByteArray()
          .reduce((n, b) => n * 256 + b, 0),
      );
    }
  });
  it('refuses leading zeros, short forms and out-of-range parts', () => {
    // ipaddr.parse alone reads 010.1.1.1 as octal 8.1.1.1, which is why parseIpv4 checks four decimal parts first.
    expect(ipaddr.parse('010.1.1.1').toString()).toBe('8.1.1.1');
    expect(ipaddr.IPv4.isValidFourPartDecimal('010.1.1.1')).toBe(false); // outside check
    for (const text of ['010.1.1.1', '10.01.1.1', '10.1.1', '10.1.1.1.1', '256.1.1.1', '10.1.1.-1', ' 10.1.1.1', '0x0a.1.1.1', '1e1.1.1.1']) {
      expect(parseIpv4(text)).toBeNull();
    }
  });
});

describe('formatIpv4 and the netmask', () => {
  it('round-trips through the integer form and agrees with netmask', () => {
    for (const text of ['0.0.0.0', '10.0.0.1', '172.31.255.254', '192.168.100.7', '255.255.255.255']) {
      const n = parseIpv4(text)!;
      expect(formatIpv4(n)).toBe(text);
      expect(n).toBe(new Netmask(`${text}/32`).netLong); // outside check (netmask)
    }
  });
  it('gives the RFC 4632 masks', () => {
    expect(formatIpv4(netmaskOf(0))).toBe('0.0.0.0'); // RFC 4632 §3.1: /0 is the whole space
    expect(formatIpv4(netmaskOf(12))).toBe('255.240.0.0'); // RFC 1918 §3: 172.16/12
    expect(formatIpv4(netmaskOf(10))).toBe('255.192.0.0'); // RFC 6598 §7: 100.64/10
    expect(formatIpv4(netmaskOf(31))).toBe('255.255.255.254'); // RFC 3021 §2
    expect(formatIpv4(netmaskOf(32))).toBe('255.255.255.255');
  });
});

describe('parseCidr', () => {
  it('parses a network block', () => {
    expect(formatCidr(parseCidr('10.20.0.0/16'))).toBe('10.20.0.0/16');
    expect(parseCidr('0.0.0.0/0').prefixLength).toBe(0);
  });
  it('explains what is wrong with malformed input', () => {
    expect(planningError(() => parseCidr('010.1.1.0/24')).message).toMatch(/without leading zeros/);
    expect(planningError(() => parseCidr('10.1.1.0')).message).toMatch(/write it like 10\.20\.0\.0\/16/);
    expect(planningError(() => parseCidr('10.1.1.0/33')).message).toMatch(/0–32/);
    expect(planningError(() => parseCidr('10.1.1.0/024')).code).toBe('invalid_cidr');
  });
  it('refuses host bits and names the network meant', () => {
    const e = planningError(() => parseCidr('10.20.1.7/24'));
    expect(e.status).toBe(400);
    expect(e.message).toBe('10.20.1.7/24 has host bits set; the network is 10.20.1.0/24.');
    expect(ipaddr.IPv4.networkAddressFromCIDR('10.20.1.7/24').toString()).toBe('10.20.1.0'); // outside check
  });
});

describe('describeSubnet', () => {
  it('a /24 is 255.255.255.0 with 254 hosts', () => {
    expect(describeSubnet(parseCidr('192.168.7.0/24'))).toEqual({
      cidr: '192.168.7.0/24', // REFERENCES RFC 4632: /24 = 255.255.255.0 = 254 hosts
      netmask: '255.255.255.0',
      gateway: '192.168.7.1',
      firstHost: '192.168.7.1',
      lastHost: '192.168.7.254',
      broadcast: '192.168.7.255',
      usableHosts: 254,
    });
  });
  it('a /31 has two usable addresses and no broadcast (RFC 3021); a /32 one', () => {
    const p2p = describeSubnet(parseCidr('10.9.0.4/31'));
    expect(p2p).toMatchObject({ firstHost: '10.9.0.4', lastHost: '10.9.0.5', broadcast: null, usableHosts: 2, gateway: '10.9.0.4' }); // RFC 3021
    expect(describeSubnet(parseCidr('10.9.0.9/32'))).toMatchObject({ firstHost: '10.9.0.9', lastHost: '10.9.0.9', broadcast: null, usableHosts: 1 });
    expect(usableHosts(30)).toBe(2); // RFC 4632: 2^2 − 2
    expect(usableHosts(8)).toBe(16777214); // RFC 4632: 2^24 − 2
  });
  it.each([
    '10.0.0.0/8',
    '172.16.0.0/12',
    '192.168.0.0/16',
    '100.64.0.0/10',
    '10.20.30.0/23',
    '10.20.30.64/26',
    '10.20.30.8/29',
    '10.20.30.4/30',
    '10.20.30.2/31',
    '10.20.30.3/32',
  ])('%s agrees with netmask and ipaddr.js', (cidr) => {
    const mine = describeSubnet(parseCidr(cidr));
    const ref = new Netmask(cidr); // outside check (netmask)
    expect(mine.netmask).toBe(ref.mask);
    expect(mine.firstHost).toBe(ref.first);
    expect(mine.lastHost).toBe(ref.last);
    expect(mine.broadcast).toBe(ref.broadcast ?? null);
    const prefix = Number(cidr.split('/')[1]);
    expect(mine.netmask).toBe(ipaddr.IPv4.subnetMaskFromPrefixLength(prefix).toString()); // outside check (ipaddr.js)
    if (prefix < 31) expect(mine.broadcast).toBe(ipaddr.IPv4.broadcastAddressFromCIDR(cidr).toString());
    expect(mine.usableHosts).toBe(prefix >= 31 ? ref.size : ref.size - 2); // RFC 4632 / RFC 3021
  });
});

describe('allocateSubnets', () => {
  it('takes the first free blocks in address order, skipping any overlap', () => {
    const got = allocateSubnets('10.20.0.0/16', 24, 3, ['10.20.0.0/24', '10.20.1.128/25', '10.99.0.0/16']);
    expect(got.map(formatCidr)).toEqual(['10.20.2.0/24', '10.20.3.0/24', '10.20.4.0/24']);
  });
  it('skips a taken block larger than the request and realigns', () => {
    expect(allocateSubnets('10.20.0.0/16', 26, 2, ['10.20.0.0/22']).map(formatCidr)).toEqual(['10.20.4.0/26', '10.20.4.64/26']);
    expect(allocateSubnets('10.20.0.0/16', 24, 1, ['10.20.0.64/30']).map(formatCidr)).toEqual(['10.20.1.0/24']);
  });
  it('every block lies inside the pool and none overlaps another (checked with netmask)', () => {
    const got = allocateSubnets('100.64.0.0/20', 27, 40, ['100.64.0.32/27', '100.64.2.0/23']).map(formatCidr);
    const pool = new Netmask('100.64.0.0/20');
    for (const [i, c] of got.entries()) {
      const n = new Netmask(c);
      expect(pool.contains(n.base) && pool.contains(n.broadcast!)).toBe(true);
      for (const other of got.slice(i + 1)) expect(n.contains(new Netmask(other).base)).toBe(false);
      expect(n.contains('100.64.0.32') || n.contains('100.64.2.1') || n.contains('100.64.3.255')).toBe(false);
    }
  });
  it('answers 409 when the pool runs out, 400 for a prefix shorter than the pool', () => {
    const full = planningError(() => allocateSubnets('10.20.0.0/30', 31, 3));
    expect(full.status).toBe(409);
    expect(full.code).toBe('pool_exhausted');
    expect(full.message).toMatch(/has only 2 free \/31 subnets; 3 were asked for/);
    const short = planningError(() => allocateSubnets('10.20.0.0/16', 12, 1));
    expect(short.status).toBe(400);
    expect(short.code).toBe('prefix_shorter_than_pool');
    expect(planningError(() => allocateSubnets('10.20.0.0/16', 24, 1, ['10.20.0.1/24'])).message).toMatch(/host bits set/);
  });
  it('gives the API answer with gateway = first host', () => {
    const { subnets } = planAddresses({ pool: '10.20.0.0/16', prefixLength: 31, count: 2, taken: ['10.20.0.0/31'] });
    expect(subnets).toEqual([
      {
        cidr: '10.20.0.2/31',
        netmask: '255.255.255.254',
        gateway: '10.20.0.2',
        firstHost: '10.20.0.2',
        lastHost: '10.20.0.3',
        broadcast: null,
        usableHosts: 2,
      },
      {
        cidr: '10.20.0.4/31',
        netmask: '255.255.255.254',
        gateway: '10.20.0.4',
        firstHost: '10.20.0.4',
        lastHost: '10.20.0.5',
        broadcast: null,
        usableHosts: 2,
      },
    ]);
  });
  it('allocates from a large pool quickly', () => {
    const got = allocateSubnets('10.0.0.0/8', 32, 4096, ['10.0.0.0/9']);
    expect(got).toHaveLength(4096);
    expect(formatCidr(got[0])).toBe('10.128.0.0/32');
  });
});
