import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { buildUser, call, signIn, useApi } from '../helpers/api';

const linkBody = {
  distanceKm: 5,
  freqMHz: 5500,
  channelWidthMHz: 20,
  txPowerDbm: 20,
  txAntennaGainDbi: 23,
  txCableLossDb: 1,
  rxAntennaGainDbi: 23,
  rxCableLossDb: 1,
};

describe('planning routes', () => {
  const ctx = useApi();

  it('requires sign-in (401) and refuses hosts (403)', async () => {
    expect((await request(ctx.app).post('/api/v1/planning/link-budget').send(linkBody)).status).toBe(401);
    const host = await signIn(ctx, await buildUser({ role: 'host' }));
    const res = await call(host, 'post', '/api/v1/planning/link-budget', linkBody);
    expect(res.status).toBe(403);
    expect(res.body.error.message).toBe('Planning is for operators and admins.');
  });

  it('computes a link budget over a given distance with every field at the top level', async () => {
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    const res = await call(op, 'post', '/api/v1/planning/link-budget', linkBody);
    expect(res.status).toBe(200);
    // ITU-R P.525: 32.4478 + 20·log10(5500) + 20·log10(5) = 121.23 dB
    expect(res.body.fsplDb).toBeCloseTo(121.23, 1);
    // EIRP = Ptx + Gtx − Ltx = 20 + 23 − 1
    expect(res.body.eirpDbm).toBeCloseTo(42, 5);
    // Prx = 42 − 121.23 + 23 − 1 = −57.23 dBm
    expect(res.body.rxSignalDbm).toBeCloseTo(-57.23, 1);
    // −174 + 10·log10(20e6) + 5 = −95.99 dBm
    expect(res.body.noiseFloorDbm).toBeCloseTo(-95.99, 1);
    // 802.11 HT MCS7 at 20 MHz needs −64 dBm: 65 Mb/s long GI; fade margin against MCS0 (−82 dBm)
    expect(res.body.expectedRateMbps).toBe(65);
    expect(res.body.fadeMarginDb).toBeCloseTo(-57.23 + 82, 1);
    expect(res.body.azimuthDeg).toBeNull();
    for (const key of ['distanceKm', 'reverseAzimuthDeg', 'tiltDeg', 'snrDb', 'fresnelRadiusM', 'earthBulgeM', 'clearanceNeededM'])
      expect(res.body).toHaveProperty(key);
  });

  it('computes distance and bearings between two sites', async () => {
    const op = await signIn(ctx, await buildUser({ role: 'admin' }));
    const { distanceKm: _d, ...rest } = linkBody;
    const res = await call(op, 'post', '/api/v1/planning/link-budget', {
      ...rest,
      a: { lat: 47.6, lon: -38.4, heightM: 20 },
      b: { lat: 47.62, lon: -38.4, heightM: 10 },
    });
    expect(res.status).toBe(200);
    expect(res.body.distanceKm).toBeGreaterThan(2.2);
    expect(res.body.distanceKm).toBeLessThan(2.3);
    expect(res.body.azimuthDeg).toBeCloseTo(0, 1);
    expect(res.body.reverseAzimuthDeg).toBeCloseTo(180, 1);
  });

  it.each([
    ['a frequency outside Wi-Fi', { ...linkBody, freqMHz: 900 }, 'freqMHz'],
    ['a width of 30 MHz', { ...linkBody, channelWidthMHz: 30 }, 'channelWidthMHz'],
    ['a negative distance', { ...linkBody, distanceKm: -1 }, 'distanceKm'],
    ['a latitude of 95', { ...linkBody, distanceKm: undefined, a: { lat: 95, lon: 0, heightM: 1 }, b: { lat: 0, lon: 0, heightM: 1 } }, 'a.lat'],
    ['no distance and no sites', { ...linkBody, distanceKm: undefined }, 'a'],
    ['power as text', { ...linkBody, txPowerDbm: '20' }, 'txPowerDbm'],
  ])('rejects a link budget with %s (400)', async (_name, body, path) => {
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    const res = await call(op, 'post', '/api/v1/planning/link-budget', body);
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain(path);
  });

  it('second edition: 80 MHz on 2.4 GHz and sites 5,500 km apart are 400s naming the problem', async () => {
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    const wide = await call(op, 'post', '/api/v1/planning/link-budget', { ...linkBody, freqMHz: 2437, channelWidthMHz: 80 });
    expect(wide.status).toBe(400);
    expect(wide.body.error.details).toEqual([
      { path: 'channelWidthMHz', message: 'channelWidthMHz must be 20 or 40 on 2.4 GHz: the band has no 80 MHz channel' },
    ]);
    const { distanceKm: _d, ...rest } = linkBody;
    const far = await call(op, 'post', '/api/v1/planning/link-budget', {
      ...rest,
      a: { lat: 47.6, lon: 8.5, heightM: 20 },
      b: { lat: 10, lon: 60, heightM: 20 },
    });
    expect(far.status).toBe(400);
    expect(far.body.error.code).toBe('sites_too_far');
    const badObstacle = await call(op, 'post', '/api/v1/planning/link-budget', { ...linkBody, obstacles: [{ distanceKm: 'near', heightM: 3 }] });
    expect(badObstacle.status).toBe(400);
    expect(badObstacle.body.error.details[0].path).toBe('obstacles.0.distanceKm');
    const k = await call(op, 'post', '/api/v1/planning/link-budget', { ...linkBody, kFactor: 0 });
    expect(k.body.error.details).toEqual([{ path: 'kFactor', message: 'kFactor must be at least 0.5' }]);
  });

  it('second edition: obstacles, line of sight, knife-edge loss, round trip and two-stream rates in one answer', async () => {
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    const { distanceKm: _d, ...rest } = linkBody;
    // 2.224 km due north (GeographicLib), masts 10 m on flat ground, a tree line 14 m tall 1.1 km from a.
    const res = await call(op, 'post', '/api/v1/planning/link-budget', {
      ...rest,
      a: { lat: 47.6, lon: -38.4, heightM: 10, groundElevationM: 0 },
      b: { lat: 47.62, lon: -38.4, heightM: 10, groundElevationM: 0 },
      obstacles: [{ distanceKm: 1.1, heightM: 14 }],
      streams: 2,
      guardInterval: 'short',
      region: 'EU',
    });
    expect(res.status).toBe(200);
    expect(res.body.lineOfSight).toMatchObject({ clear: false, atDistanceKm: 1.1, blockedBy: 'obstacle' });
    expect(res.body.diffractionLossDb).toBeGreaterThan(6); // the top is above the line: ν > 0, so J > J(0) ≈ 6.0 dB (ITU-R P.526)
    expect(res.body.roundTripUs).toBeCloseTo((2 * 2223.9) / 299.792458, 0); // 2d/c in µs
    expect(res.body.radioHorizonKm).toBeCloseTo(4.12 * 2 * Math.sqrt(10), 1); // ITU-R P.530: 26.06 km
    expect(res.body.streams).toBe(2);
    expect(res.body.rates[0]).toMatchObject({ mcs: 8, rateMbps: 14.4 }); // HT20 MCS8 short GI (IEEE 802.11-2020 HT tables)
    expect(res.body.warnings.join(' ')).toMatch(/knife-edge/);
  });

  it('regulatory second edition: band edge, TPC and indoor-only from the body (ETSI EN 301 893, ECC/DEC/(04)08)', async () => {
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    const base = { region: 'EU', antennaGainDbi: 2, txPowerDbm: 10, cableLossDb: 0, linkType: 'point-to-point' };
    const edge = await call(op, 'post', '/api/v1/planning/regulatory', { ...base, freqMHz: 2483 });
    expect(edge.body.compliant).toBe(false);
    expect(edge.body.rule).toMatch(/band edge at 2483.5 MHz/);
    const noTpc = await call(op, 'post', '/api/v1/planning/regulatory', { ...base, freqMHz: 5500, tpc: false });
    expect(noTpc.body.maxEirpDbm).toBe(27); // REFERENCES: 3 dB lower without TPC
    const roof = await call(op, 'post', '/api/v1/planning/regulatory', { ...base, freqMHz: 5300 });
    expect(roof.body.compliant).toBe(false);
    const indoor = await call(op, 'post', '/api/v1/planning/regulatory', { ...base, freqMHz: 5300, deployment: 'indoor' });
    expect(indoor.body.compliant).toBe(true);
    const bad = await call(op, 'post', '/api/v1/planning/regulatory', { ...base, freqMHz: 5300, deployment: 'roof' });
    expect(bad.body.error.details).toEqual([{ path: 'deployment', message: 'deployment must be outdoor or indoor' }]);
  });

  it('checks the US 2.4 GHz point-to-point rule (47 CFR §15.247 worked example: 24 dBi → 24 dBm, 48 dBm EIRP)', async () => {
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    const res = await call(op, 'post', '/api/v1/planning/regulatory', {
      region: 'US',
      freqMHz: 2437,
      antennaGainDbi: 24,
      txPowerDbm: 24,
      cableLossDb: 0,
      linkType: 'point-to-point',
    });
    expect(res.status).toBe(200);
    expect(res.body.maxTxPowerDbm).toBeCloseTo(24, 5);
    expect(res.body.maxEirpDbm).toBeCloseTo(48, 5);
    expect(res.body.compliant).toBe(true);
    expect(typeof res.body.rule).toBe('string');
  });

  it('caps EU 2.4 GHz at 20 dBm EIRP whatever the antenna (ETSI EN 300 328)', async () => {
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    const res = await call(op, 'post', '/api/v1/planning/regulatory', {
      region: 'EU',
      freqMHz: 2437,
      antennaGainDbi: 8,
      txPowerDbm: 20,
      cableLossDb: 1,
      linkType: 'point-to-multipoint',
    });
    expect(res.body.maxEirpDbm).toBeCloseTo(20, 5);
    expect(res.body.eirpDbm).toBeCloseTo(27, 5);
    expect(res.body.compliant).toBe(false);
  });

  it('refuses an unknown region and a frequency outside the licence-exempt bands with 400', async () => {
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    const base = { antennaGainDbi: 8, txPowerDbm: 20, cableLossDb: 1, linkType: 'point-to-point' };
    expect((await call(op, 'post', '/api/v1/planning/regulatory', { ...base, region: 'XX', freqMHz: 2437 })).status).toBe(400);
    expect((await call(op, 'post', '/api/v1/planning/regulatory', { ...base, region: 'EU', freqMHz: 5900 })).status).toBe(400);
  });

  it('lists the channels a region allows (JP 14 noted as 802.11b only; US DFS noted)', async () => {
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    const jp = await op.get('/api/v1/planning/channels?region=JP&band=2.4');
    expect(jp.status).toBe(200);
    const ch14 = jp.body.channels.find((c: { channel: number }) => c.channel === 14);
    expect(ch14.centerMHz).toBe(2484); // IEEE 802.11: channel 14 = 2484 MHz
    expect(ch14.note).toMatch(/802\.11b/);
    const us = await op.get('/api/v1/planning/channels?region=US&band=2.4');
    expect(us.body.channels.map((c: { channel: number }) => c.channel)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11]);
    const us5 = await op.get('/api/v1/planning/channels?region=US&band=5');
    const c52 = us5.body.channels.find((c: { channel: number }) => c.channel === 52);
    expect(c52.centerMHz).toBe(5260);
    expect(c52.note).toMatch(/DFS/);
    expect((await op.get('/api/v1/planning/channels?region=XX&band=2.4')).status).toBe(400);
    // At a width, only primaries whose whole fixed block is allowed (IEEE 802.11 bonding; ETSI EN 301 893 ends at 5725 MHz)
    const eu80 = await op.get('/api/v1/planning/channels?region=EU&band=5&channelWidthMHz=80');
    expect(eu80.body.channels.map((c: { channel: number }) => c.channel)).toEqual([36, 40, 44, 48, 52, 56, 60, 64, 100, 104, 108, 112, 116, 120, 124, 128]);
    const no80 = await op.get('/api/v1/planning/channels?region=EU&band=2.4&channelWidthMHz=80');
    expect(no80.status).toBe(400);
    expect(no80.body.error.details[0].path).toBe('channelWidthMHz');
  });

  it('allocates the first free subnets in address order, skipping taken ones (RFC 4632)', async () => {
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    const res = await call(op, 'post', '/api/v1/planning/address-plan', { pool: '10.64.0.0/16', prefixLength: 24, count: 2, taken: ['10.64.0.0/24'] });
    expect(res.status).toBe(200);
    expect(res.body.subnets[0]).toEqual({
      cidr: '10.64.1.0/24',
      netmask: '255.255.255.0',
      gateway: '10.64.1.1',
      firstHost: '10.64.1.1',
      lastHost: '10.64.1.254',
      broadcast: '10.64.1.255',
      usableHosts: 254,
    });
    expect(res.body.subnets[1].cidr).toBe('10.64.2.0/24');
  });

  it('plans IPv6 /64s from a RFC 4193 /48 and warns about a public IPv4 pool (RFC 1918, RFC 6598)', async () => {
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    const v6 = await call(op, 'post', '/api/v1/planning/address-plan', {
      pool: 'fd12:3456:789a::/48',
      prefixLength: 64,
      count: 2,
      taken: ['fd12:3456:789a::/64'],
    });
    expect(v6.status).toBe(200);
    expect(v6.body.subnets.map((s: { cidr: string }) => s.cidr)).toEqual(['fd12:3456:789a:1::/64', 'fd12:3456:789a:2::/64']);
    expect(v6.body.subnets[0]).toMatchObject({ netmask: null, broadcast: null, gateway: 'fd12:3456:789a:1::1' });
    expect(v6.body.warnings).toEqual([]);
    const mixed = await call(op, 'post', '/api/v1/planning/address-plan', { pool: 'fd12:3456:789a::/48', prefixLength: 64, count: 1, taken: ['10.0.0.0/24'] });
    expect(mixed.body.error.details).toEqual([{ path: 'taken.0', message: 'taken.0 must be IPv6 like the pool' }]);
    const pub = await call(op, 'post', '/api/v1/planning/address-plan', { pool: '198.51.100.0/24', prefixLength: 26, count: 1, expectedClients: 100 });
    expect(pub.status).toBe(200);
    expect(pub.body.warnings[0]).toMatch(/neither private \(RFC 1918/);
    expect(pub.body.dhcp).toMatchObject({ addressesNeeded: 151, suggestedPrefixLength: 24, fitsRequested: false });
    expect((await call(op, 'post', '/api/v1/planning/address-plan', { pool: '10.0.0.0/8', prefixLength: 40, count: 1 })).body.error.details[0].path).toBe(
      'prefixLength',
    );
  });

  it('gives /31 two usable hosts and no broadcast (RFC 3021)', async () => {
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    const res = await call(op, 'post', '/api/v1/planning/address-plan', { pool: '10.0.0.0/30', prefixLength: 31, count: 2 });
    expect(res.body.subnets.map((s: { broadcast: null; usableHosts: number }) => [s.broadcast, s.usableHosts])).toEqual([
      [null, 2],
      [null, 2],
    ]);
  });

  it('answers 409 when the pool is exhausted and 400 for a prefix shorter than the pool or a malformed CIDR', async () => {
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    const full = await call(op, 'post', '/api/v1/planning/address-plan', { pool: '10.0.0.0/24', prefixLength: 25, count: 3 });
    expect(full.status).toBe(409);
    expect((await call(op, 'post', '/api/v1/planning/address-plan', { pool: '10.0.0.0/24', prefixLength: 16, count: 1 })).status).toBe(400);
    expect((await call(op, 'post', '/api/v1/planning/address-plan', { pool: '010.0.0.0/24', prefixLength: 26, count: 1 })).status).toBe(400);
    expect((await call(op, 'post', '/api/v1/planning/address-plan', { pool: '10.0.0.0/33', prefixLength: 26, count: 1 })).status).toBe(400);
  });
});
