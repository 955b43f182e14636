import request from 'supertest';
import { describe, expect, it } from 'vitest';
import geographiclib from 'geographiclib-geodesic';
import { buildUser, call, signIn, useApi, type Agent } from '../helpers/api';

// Synthetic SRTM tiles made here (never real data): 1201 × 1201 big-endian int16, rows north to south (REFERENCES SRTM).
const N = 1201;
function tile(height: (row: number, col: number) => number): Buffer {
  const buf = Buffer.alloc(N * N * 2);
  for (let r = 0; r < N; r++) for (let c = 0; c < N; c++) buf.writeInt16BE(height(r, c), (r * N + c) * 2);
  return buf;
}
/** A plain at 100 m with a 400 m ridge along longitude 8.5 (column 600) from row 0 to the bottom. */
const ridge = tile((_r, c) => (Math.abs(c - 600) <= 2 ? 400 : 100));
const flat = (m: number) => tile(() => m);

const radio = {
  freqMHz: 5500,
  channelWidthMHz: 20,
  txPowerDbm: 18,
  txAntennaGainDbi: 23,
  txCableLossDb: 0,
  rxAntennaGainDbi: 23,
  rxCableLossDb: 0,
  region: 'EU',
};

describe('terrain tiles and link budgets over real ground', () => {
  const ctx = useApi();
  const upload = (agent: Agent, bytes: Buffer, name: string) => agent.post('/api/v1/terrain/tiles').set('X-CSRF-Token', agent.csrf).attach('tile', bytes, name);

  it('401 signed out, 403 for operators uploading, 400 for bad tiles with a reason, 201 then listed and deleted', async () => {
    expect((await request(ctx.app).get('/api/v1/terrain/tiles')).status).toBe(401);
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    const opUp = await upload(op, flat(5), 'N47E008.hgt');
    expect(opUp.status).toBe(403);
    expect(opUp.body.error.message).toBe('Only admins upload terrain tiles.');

    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    const wrongSize = await upload(admin, Buffer.alloc(1000), 'N47E008.hgt');
    expect(wrongSize.status).toBe(400);
    expect(wrongSize.body.error.message).toMatch(/is 1,000 bytes; an SRTM tile is 2,884,802 bytes/);
    const wrongName = await upload(admin, flat(5), 'valley.hgt');
    expect(wrongName.status).toBe(400);
    expect(wrongName.body.error.message).toMatch(/named after its south-west corner, like N47W039\.hgt/);
    const voids = await upload(
      admin,
      tile(() => -32768),
      'N47E008.hgt',
    );
    expect(voids.status).toBe(400);
    expect(voids.body.error.message).toMatch(/every sample is void/);
    const swapped = await upload(
      admin,
      tile(() => 0x6400),
      'N47E008.hgt',
    ); // 25600 m: 100 m written little-endian
    expect(swapped.status).toBe(400);
    expect(swapped.body.error.message).toMatch(/not a big-endian SRTM tile/);
    const none = await admin.post('/api/v1/terrain/tiles').set('X-CSRF-Token', admin.csrf).send({});
    expect(none.status).toBe(400);

    const ok = await upload(admin, ridge, 'n47e008.hgt');
    expect(ok.status).toBe(201);
    expect(ok.body.data).toMatchObject({ name: 'N47E008', south: 47, west: 8, samplesPerSide: 1201 });
    const list = await call(op, 'get', '/api/v1/terrain/tiles');
    expect(list.body.data.map((t: { name: string }) => t.name)).toEqual(['N47E008']);
    expect((await call(op, 'delete', '/api/v1/terrain/tiles/N47E008')).status).toBe(403);
    expect((await call(admin, 'delete', '/api/v1/terrain/tiles/N47E008')).status).toBe(204);
    expect((await call(admin, 'delete', '/api/v1/terrain/tiles/N47E008')).status).toBe(404);
    expect((await call(admin, 'delete', '/api/v1/terrain/tiles/..%2Fetc')).status).toBe(400);
  });

  it('takes the ground from the tiles (bilinear), fills missing end elevations and finds the ridge', async () => {
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    expect((await upload(admin, ridge, 'N47E008.hgt')).status).toBe(201);
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    // West to east across the ridge at 8.5° E: 8.45 → 8.55 at 47.5° N, masts 20 m.
    const body = { ...radio, terrain: true, a: { lat: 47.5, lon: 8.45, heightM: 20 }, b: { lat: 47.5, lon: 8.55, heightM: 20 } };
    const res = await call(op, 'post', '/api/v1/planning/link-budget', body);
    expect(res.status).toBe(200);
    expect(res.body.terrainUsed).toBe(true);
    expect(res.body.profile.length).toBeGreaterThanOrEqual(101); // API.md: ≥ 100 points
    expect(res.body.profile[0].groundM).toBe(100);
    expect(Math.max(...res.body.profile.map((p: { groundM: number }) => p.groundM))).toBeGreaterThan(390); // the ridge, 400 m
    const dKm = (geographiclib.Geodesic.WGS84.Inverse(47.5, 8.45, 47.5, 8.55).s12 ?? NaN) / 1000; // GeographicLib, outside check
    expect(res.body.distanceKm).toBeCloseTo(dKm, 3);
    expect(res.body.lineOfSight).toMatchObject({ clear: false, blockedBy: 'ground' });
    expect(res.body.lineOfSight.atDistanceKm).toBeCloseTo(dKm / 2, 1); // the ridge is mid-path
    expect(res.body.lineOfSight.worstClearanceM).toBeLessThan(-270); // line at 120 m, ridge 400 m
    expect(res.body.warnings.join(' ')).toMatch(/Line of sight blocked/);

    // Without terrain the same body sees flat ground at 0 m and a clear path.
    const plain = await call(op, 'post', '/api/v1/planning/link-budget', { ...body, terrain: false });
    expect(plain.body.terrainUsed).toBe(false);
    expect(plain.body.lineOfSight.clear).toBe(true);
  });

  it('bilinear: halfway between samples of 100 m and 400 m reads 250 m', async () => {
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    // West half 100 m, east half 400 m, the step between columns 600 and 601.
    expect(
      (
        await upload(
          admin,
          tile((_r, c) => (c <= 600 ? 100 : 400)),
          'N10E010.hgt',
        )
      ).status,
    ).toBe(201);
    const col = 600.5 / (N - 1); // halfway between columns 600 and 601
    const res = await call(admin, 'post', '/api/v1/planning/link-budget', {
      ...radio,
      terrain: true,
      a: { lat: 10.5, lon: 10 + col, heightM: 10 },
      b: { lat: 10.6, lon: 10 + col, heightM: 10 },
    });
    expect(res.status).toBe(200);
    for (const p of res.body.profile) expect(p.groundM).toBeCloseTo(250, 0);
  });

  it('a path leaving the tiles is a 400 naming the missing tile; nothing is a 500', async () => {
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    expect((await upload(admin, flat(50), 'N47E008.hgt')).status).toBe(201);
    const res = await call(admin, 'post', '/api/v1/planning/link-budget', {
      ...radio,
      terrain: true,
      a: { lat: 47.9, lon: 8.9, heightM: 10 },
      b: { lat: 48.05, lon: 9.05, heightM: 10 },
    });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('terrain_not_covered');
    expect(res.body.error.message).toMatch(/missing .*N48E009\.hgt/);
    // Far north a degree of longitude is about 37 km: 480 km east–west at 70.5° N crosses 13 tiles, more than the 8 allowed.
    const long = await call(admin, 'post', '/api/v1/planning/link-budget', {
      ...radio,
      terrain: true,
      a: { lat: 70.5, lon: 10.05, heightM: 30 },
      b: { lat: 70.5, lon: 22.95, heightM: 30 },
    });
    expect(long.status).toBe(400);
    expect(long.body.error.message).toMatch(/crosses 13 elevation tiles/);
    const dist = await call(admin, 'post', '/api/v1/planning/link-budget', { ...radio, terrain: true, distanceKm: 3 });
    expect(dist.status).toBe(400);
    expect(dist.body.error.details).toEqual([{ path: 'terrain', message: 'terrain needs sites a and b, not distanceKm' }]);
  });
});
