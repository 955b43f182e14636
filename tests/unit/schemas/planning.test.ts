import { describe, expect, it } from 'vitest';
import { addressPlanBodySchema, channelsQuerySchema, linkBudgetBodySchema, regulatoryBodySchema } from '../../../shared/schemas/planning';

const radio = { freqMHz: 5800, channelWidthMHz: 20, txPowerDbm: 20, txAntennaGainDbi: 23, txCableLossDb: 1, rxAntennaGainDbi: 23, rxCableLossDb: 1 };
const a = { lat: 47.5, lon: 8.7, heightM: 12 };
const b = { lat: 47.52, lon: 8.74, heightM: 9, groundElevationM: 430 };

const messages = (r: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  (r.error?.issues ?? []).map((i) => `${i.path.join('.')}: ${i.message}`);

describe('linkBudgetBodySchema', () => {
  it('accepts sites a and b, defaulting the noise figure to 5 dB', () => {
    const r = linkBudgetBodySchema.safeParse({ ...radio, a, b });
    expect(r.success).toBe(true);
    expect(r.data?.noiseFigureDb).toBe(5); // API.md: noiseFigureDb defaults to 5
  });
  it('accepts distanceKm alone', () => {
    expect(linkBudgetBodySchema.safeParse({ ...radio, distanceKm: 3.2 }).success).toBe(true);
  });
  it('wants exactly one of the two forms', () => {
    expect(messages(linkBudgetBodySchema.safeParse({ ...radio, a, b, distanceKm: 3 }))).toEqual([
      'distanceKm: Give either sites a and b or distanceKm, not both',
    ]);
    expect(messages(linkBudgetBodySchema.safeParse({ ...radio }))).toEqual(['a: Give sites a and b, or distanceKm']);
    expect(messages(linkBudgetBodySchema.safeParse({ ...radio, a }))).toEqual(['b: Both sites a and b are needed']);
    expect(messages(linkBudgetBodySchema.safeParse({ ...radio, a, b: { ...a } }))).toEqual(['b: Sites a and b are the same place; pick two different sites']);
  });
  it('rejects physically impossible input with a readable message', () => {
    expect(messages(linkBudgetBodySchema.safeParse({ ...radio, distanceKm: -1 }))).toEqual(['distanceKm: distanceKm must be greater than 0 km']);
    expect(messages(linkBudgetBodySchema.safeParse({ ...radio, freqMHz: 3000, distanceKm: 1 }))).toEqual([
      'freqMHz: freqMHz must be a Wi-Fi frequency: 2400–2500 or 4900–5900 MHz',
    ]);
    expect(messages(linkBudgetBodySchema.safeParse({ ...radio, channelWidthMHz: 30, distanceKm: 1 }))).toEqual([
      'channelWidthMHz: channelWidthMHz must be 20, 40 or 80',
    ]);
    expect(messages(linkBudgetBodySchema.safeParse({ ...radio, a: { ...a, lat: 91 }, b }))).toEqual(['a.lat: lat must be at most 90 degrees']);
    expect(messages(linkBudgetBodySchema.safeParse({ ...radio, a, b: { ...b, heightM: -2 } }))).toEqual(['b.heightM: heightM must be at least 0 m']);
    expect(messages(linkBudgetBodySchema.safeParse({ ...radio, txPowerDbm: '20', distanceKm: 1 }))).toEqual(['txPowerDbm: txPowerDbm must be a number']);
  });
});

describe('regulatoryBodySchema', () => {
  const body = { region: 'US', freqMHz: 2437, antennaGainDbi: 24, txPowerDbm: 24, cableLossDb: 0, linkType: 'point-to-point' };
  it('accepts the API.md body', () => {
    expect(regulatoryBodySchema.safeParse(body).success).toBe(true);
  });
  it('rejects other regions, link types and non-Wi-Fi frequencies', () => {
    expect(messages(regulatoryBodySchema.safeParse({ ...body, region: 'JP' }))).toEqual(['region: region must be US or EU']);
    expect(messages(regulatoryBodySchema.safeParse({ ...body, linkType: 'mesh' }))).toEqual([
      'linkType: linkType must be point-to-point or point-to-multipoint',
    ]);
    expect(messages(regulatoryBodySchema.safeParse({ ...body, freqMHz: 900 }))).toHaveLength(1);
    expect(messages(regulatoryBodySchema.safeParse({ ...body, cableLossDb: -1 }))).toEqual(['cableLossDb: cableLossDb must be at least 0 dB']);
  });
});

describe('channelsQuerySchema', () => {
  it('accepts US|EU|JP and 2.4|5 only', () => {
    expect(channelsQuerySchema.safeParse({ region: 'JP', band: '2.4' }).success).toBe(true);
    expect(messages(channelsQuerySchema.safeParse({ region: 'UK', band: '6' }))).toEqual([
      'region: region must be US, EU or JP',
      'band: band must be 2.4 or 5',
    ]);
  });
});

describe('addressPlanBodySchema', () => {
  it('accepts the API.md body', () => {
    expect(addressPlanBodySchema.safeParse({ pool: '10.20.0.0/16', prefixLength: 24, count: 4, taken: ['10.20.0.0/24'] }).success).toBe(true);
  });
  it('explains malformed CIDRs', () => {
    expect(messages(addressPlanBodySchema.safeParse({ pool: '010.20.0.0/16', prefixLength: 24, count: 1 }))[0]).toMatch(/^pool: .*without leading zeros/);
    expect(messages(addressPlanBodySchema.safeParse({ pool: '10.20.0.0/16', prefixLength: 24, count: 1, taken: ['10.20.0.5/24'] }))).toEqual([
      'taken.0: 10.20.0.5/24 has host bits set; the network is 10.20.0.0/24.',
    ]);
  });
  it('bounds count and prefix length', () => {
    expect(messages(addressPlanBodySchema.safeParse({ pool: '10.20.0.0/16', prefixLength: 24, count: 0 }))).toEqual(['count: count must be 1–4096']);
    expect(messages(addressPlanBodySchema.safeParse({ pool: '10.20.0.0/16', prefixLength: 24, count: 5000 }))).toEqual(['count: count must be 1–4096']);
    expect(messages(addressPlanBodySchema.safeParse({ pool: '10.20.0.0/16', prefixLength: 33, count: 1 }))).toEqual([
      'prefixLength: prefixLength must be 1–32 for an IPv4 pool',
    ]);
    expect(messages(addressPlanBodySchema.safeParse({ pool: '10.20.0.0/16', prefixLength: 12, count: 1 }))).toEqual([
      "prefixLength: prefixLength /12 is shorter than the pool's /16; use /16 or longer",
    ]);
  });
});

describe('parsed bodies feed the computations directly (thin routes)', () => {
  it('link budget, regulatory, channels and address plan', async () => {
    const { computeLinkBudget, computeRegulatory, listChannels } = await import('../../../shared/radio');
    const { planAddresses } = await import('../../../shared/addressing');
    const lb = computeLinkBudget(linkBudgetBodySchema.parse({ ...radio, a, b }));
    expect(lb.azimuthDeg).not.toBeNull();
    const reg = computeRegulatory(
      regulatoryBodySchema.parse({ region: 'US', freqMHz: 2437, antennaGainDbi: 24, txPowerDbm: 24, cableLossDb: 0, linkType: 'point-to-point' }),
    );
    expect([reg.maxTxPowerDbm, reg.maxEirpDbm]).toEqual([24, 48]); // REFERENCES §15.247 worked example
    const q = channelsQuerySchema.parse({ region: 'US', band: '2.4' });
    expect(listChannels(q.region, q.band).channels).toHaveLength(11); // REFERENCES Channels: US 1–11
    const plan = planAddresses(addressPlanBodySchema.parse({ pool: '10.20.0.0/16', prefixLength: 24, count: 2 }));
    expect(plan.subnets.map((s) => s.cidr)).toEqual(['10.20.0.0/24', '10.20.1.0/24']);
  });
});
