import { z } from 'zod';
import { parseCidr } from '../addressing/cidr';
import { parseCidr6 } from '../addressing/ipv6';
import { PlanningError } from '../radio/errors';

const num = (name: string) => z.number({ error: `${name} must be a number` });
const between = (name: string, lo: number, hi: number, unit: string) =>
  num(name).min(lo, `${name} must be at least ${lo} ${unit}`).max(hi, `${name} must be at most ${hi} ${unit}`);

/** Wi-Fi channels only exist in 2400–2500 and 4900–5900 MHz. */
export const wifiFreqMHzSchema = num('freqMHz').refine(
  (f) => (f >= 2400 && f <= 2500) || (f >= 4900 && f <= 5900),
  'freqMHz must be a Wi-Fi frequency: 2400–2500 or 4900–5900 MHz',
);
export const channelWidthMHzSchema = z.union([z.literal(20), z.literal(40), z.literal(80)], { error: 'channelWidthMHz must be 20, 40 or 80' });

export const linkEndSchema = z.object({
  lat: between('lat', -90, 90, 'degrees'),
  lon: between('lon', -180, 180, 'degrees'),
  heightM: between('heightM', 0, 300, 'm'),
  groundElevationM: between('groundElevationM', -450, 9000, 'm').optional(),
});

export const linkBudgetBodySchema = z
  .object({
    a: linkEndSchema.optional(),
    b: linkEndSchema.optional(),
    distanceKm: num('distanceKm').positive('distanceKm must be greater than 0 km').max(500, 'distanceKm must be at most 500 km'),
    freqMHz: wifiFreqMHzSchema,
    channelWidthMHz: channelWidthMHzSchema,
    txPowerDbm: between('txPowerDbm', -10, 36, 'dBm'),
    txAntennaGainDbi: between('txAntennaGainDbi', -10, 45, 'dBi'),
    txCableLossDb: between('txCableLossDb', 0, 30, 'dB'),
    rxAntennaGainDbi: between('rxAntennaGainDbi', -10, 45, 'dBi'),
    rxCableLossDb: between('rxCableLossDb', 0, 30, 'dB'),
    noiseFigureDb: between('noiseFigureDb', 0, 20, 'dB').default(5),
    streams: z.union([z.literal(1), z.literal(2)], { error: 'streams must be 1 or 2' }).default(1),
    guardInterval: z.enum(['long', 'short'], { error: 'guardInterval must be long or short' }).default('long'),
    // ITU-R P.530: 4/3 median; 2/3 worst case in temperate climates; below 0.5 or above 10 is not a planning value.
    kFactor: num('kFactor')
      .min(0.5, 'kFactor must be at least 0.5')
      .max(10, 'kFactor must be at most 10')
      .default(4 / 3),
    obstacles: z
      .array(
        z.object({
          distanceKm: num('distanceKm').positive('distanceKm must be greater than 0 km (distance from end a)'),
          heightM: between('heightM', -450, 9000, 'm'),
        }),
        { error: 'obstacles must be a list of {distanceKm, heightM}' },
      )
      .max(50, 'obstacles may list at most 50 entries')
      .default([]),
    region: z.enum(['US', 'EU'], { error: 'region must be US or EU' }).optional(),
    targetRateMbps: between('targetRateMbps', 1, 2000, 'Mb/s').optional(),
    terrain: z.boolean({ error: 'terrain must be true or false' }).default(false),
  })
  .partial({ distanceKm: true })
  .superRefine((body, ctx) => {
    if (typeof body.freqMHz === 'number' && body.freqMHz < 3000 && body.channelWidthMHz === 80) {
      ctx.addIssue({ code: 'custom', path: ['channelWidthMHz'], message: 'channelWidthMHz must be 20 or 40 on 2.4 GHz: the band has no 80 MHz channel' });
    }
    if (body.terrain && body.distanceKm !== undefined) {
      ctx.addIssue({ code: 'custom', path: ['terrain'], message: 'terrain needs sites a and b, not distanceKm' });
    }
    const sites = body.a !== undefined || body.b !== undefined;
    const distance = body.distanceKm !== undefined;
    if (sites && distance) {
      ctx.addIssue({ code: 'custom', path: ['distanceKm'], message: 'Give either sites a and b or distanceKm, not both' });
    } else if (!sites && !distance) {
      ctx.addIssue({ code: 'custom', path: ['a'], message: 'Give sites a and b, or distanceKm' });
    } else if (sites && (body.a === undefined || body.b === undefined)) {
      ctx.addIssue({ code: 'custom', path: [body.a ? 'b' : 'a'], message: 'Both sites a and b are needed' });
    } else if (body.a && body.b && body.a.lat === body.b.lat && body.a.lon === body.b.lon) {
      ctx.addIssue({ code: 'custom', path: ['b'], message: 'Sites a and b are the same place; pick two different sites' });
    }
  });
export type LinkBudgetBody = z.input<typeof linkBudgetBodySchema>;

export const regulatoryBodySchema = z.object({
  region: z.enum(['US', 'EU'], { error: 'region must be US or EU' }),
  freqMHz: wifiFreqMHzSchema,
  antennaGainDbi: between('antennaGainDbi', -10, 45, 'dBi'),
  txPowerDbm: between('txPowerDbm', -10, 36, 'dBm'),
  cableLossDb: between('cableLossDb', 0, 30, 'dB'),
  linkType: z.enum(['point-to-point', 'point-to-multipoint'], { error: 'linkType must be point-to-point or point-to-multipoint' }),
  channelWidthMHz: channelWidthMHzSchema.default(20),
  tpc: z.boolean({ error: 'tpc must be true or false' }).default(true),
  deployment: z.enum(['outdoor', 'indoor'], { error: 'deployment must be outdoor or indoor' }).default('outdoor'),
});
export type RegulatoryBody = z.input<typeof regulatoryBodySchema>;

export const channelsQuerySchema = z.object({
  region: z.enum(['US', 'EU', 'JP'], { error: 'region must be US, EU or JP' }),
  band: z.enum(['2.4', '5'], { error: 'band must be 2.4 or 5' }),
  /** Optional: only the primaries whose whole block at this width is allowed (validChannels). */
  channelWidthMHz: z.enum(['20', '40', '80'], { error: 'channelWidthMHz must be 20, 40 or 80' }).transform(Number).optional(),
});
export type ChannelsQuery = z.infer<typeof channelsQuerySchema>;

/** A strict IPv4 CIDR; the message says what is wrong (leading zeros, host bits set, …). */
export const cidrSchema = z.string({ error: 'must be an IPv4 CIDR like 10.20.0.0/16' }).superRefine((text, ctx) => {
  try {
    parseCidr(text);
  } catch (e) {
    if (!(e instanceof PlanningError)) throw e;
    ctx.addIssue({ code: 'custom', message: e.message });
  }
});

/** An IPv4 or IPv6 CIDR (IPv6 for RFC 4193 pools such as fd12:3456:789a::/48). */
export const anyCidrSchema = z.string({ error: 'must be a CIDR like 10.20.0.0/16 or fd12:3456:789a::/48' }).superRefine((text, ctx) => {
  try {
    if (text.includes(':')) parseCidr6(text);
    else parseCidr(text);
  } catch (e) {
    if (!(e instanceof PlanningError)) throw e;
    ctx.addIssue({ code: 'custom', message: e.message });
  }
});

export const addressPlanBodySchema = z
  .object({
    pool: anyCidrSchema,
    prefixLength: num('prefixLength')
      .int('prefixLength must be a whole number')
      .min(1, 'prefixLength must be 1–32 (IPv4) or 1–128 (IPv6)')
      .max(128, 'prefixLength must be 1–32 (IPv4) or 1–128 (IPv6)'),
    count: num('count').int('count must be a whole number').min(1, 'count must be 1–4096').max(4096, 'count must be 1–4096'),
    taken: z.array(anyCidrSchema).max(65536, 'taken may list at most 65536 blocks').optional(),
    expectedClients: num('expectedClients')
      .int('expectedClients must be a whole number')
      .min(1, 'expectedClients must be 1–100000')
      .max(100000, 'expectedClients must be 1–100000')
      .optional(),
  })
  .superRefine((body, ctx) => {
    let poolPrefix: number;
    const v6 = typeof body.pool === 'string' && body.pool.includes(':');
    try {
      poolPrefix = v6 ? parseCidr6(body.pool).prefixLength : parseCidr(body.pool).prefixLength;
    } catch {
      return; // already reported on `pool`
    }
    if (!v6 && body.prefixLength > 32) {
      ctx.addIssue({ code: 'custom', path: ['prefixLength'], message: 'prefixLength must be 1–32 for an IPv4 pool' });
    } else if (body.prefixLength < poolPrefix) {
      ctx.addIssue({
        code: 'custom',
        path: ['prefixLength'],
        message: `prefixLength /${body.prefixLength} is shorter than the pool's /${poolPrefix}; use /${poolPrefix} or longer`,
      });
    }
    body.taken?.forEach((t, i) => {
      if (typeof t === 'string' && t.includes(':') !== v6)
        ctx.addIssue({ code: 'custom', path: ['taken', i], message: `must be ${v6 ? 'IPv6' : 'IPv4'} like the pool` });
    });
    if (v6 && body.expectedClients !== undefined)
      ctx.addIssue({ code: 'custom', path: ['expectedClients'], message: 'expectedClients sizes IPv4 DHCP pools; an IPv6 /64 holds any number of clients' });
  });
export type AddressPlanBody = z.infer<typeof addressPlanBodySchema>;
