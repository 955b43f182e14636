import request from 'supertest';
import { describe, expect, it } from 'vitest';
import type { NodeState } from '../../shared/enums';
import { buildUser, signIn, truncateAll, useApi } from '../helpers/api';
import { buildLink, buildNeighbourhood, buildNode, buildRadio, buildSite } from '../helpers/factories';

const NO_NODES: Record<NodeState, number> = { online: 0, degraded: 0, offline: 0, maintenance: 0, unknown: 0, stranded: 0 };

// No radio reported a MAC in these tests: nothing heard, nothing silent, nothing moved.
const NOTHING_ON_THE_AIR = { silentLinks: [], discoveredLinkCount: 0, radioMoves: [] };

describe('overview API', () => {
  const ctx = useApi();

  /** Two neighbourhoods: A with two sites (one hosted) and three nodes, B with one site and one node. */
  async function twoNeighbourhoods() {
    await truncateAll(ctx.sequelize); // the counts below are of everything in the database
    const operatorA = await buildUser({ role: 'operator' });
    const host = await buildUser({ role: 'host' });
    const hoodA = await buildNeighbourhood({ operators: [operatorA] });
    const hoodB = await buildNeighbourhood();
    const hosted = await buildSite({ neighbourhoodId: hoodA.id, hostUserId: host.id });
    const plain = await buildSite({ neighbourhoodId: hoodA.id });
    const setState = async (node: Awaited<ReturnType<typeof buildNode>>, state: NodeState) => node.update({ state });
    await setState(await buildNode({ siteId: hosted.id }), 'online');
    await setState(await buildNode({ siteId: plain.id }), 'offline');
    await setState(await buildNode({ siteId: plain.id }), 'offline');
    const drifting = await setState(await buildNode({ neighbourhoodId: hoodB.id, name: 'ridge-b' }), 'degraded');
    await drifting.update({ drift: [{ field: 'channel', expected: 36, reported: 40 }] });
    return { operatorA, host, drifting };
  }

  it('answers a signed-out caller with 401', async () => {
    const res = await request(ctx.app).get('/api/v1/overview');
    expect(res.status).toBe(401);
    expect(res.body).toEqual({ error: { code: 'not_signed_in', message: 'Sign in to continue.' } });
  });

  it('counts everything by state for an admin', async () => {
    const { drifting } = await twoNeighbourhoods();
    const res = await (await signIn(ctx, await buildUser({ role: 'admin' }))).get('/api/v1/overview');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      data: {
        countsByState: { ...NO_NODES, online: 1, offline: 2, degraded: 1 },
        nodeCount: 4,
        siteCount: 3,
        neighbourhoodCount: 2,
        openOutages: [],
        driftNodes: [{ id: drifting.id, name: 'ridge-b', drift: [{ field: 'channel', expected: 36, reported: 40 }] }],
        weakestLinks: [],
        ...NOTHING_ON_THE_AIR,
      },
    });
  });

  it('counts only an operator’s neighbourhoods, and lists no drift from elsewhere', async () => {
    const { operatorA } = await twoNeighbourhoods();
    const res = await (await signIn(ctx, operatorA)).get('/api/v1/overview');
    expect(res.body.data).toEqual({
      countsByState: { ...NO_NODES, online: 1, offline: 2 },
      nodeCount: 3,
      siteCount: 2,
      neighbourhoodCount: 1,
      openOutages: [],
      driftNodes: [],
      weakestLinks: [],
      ...NOTHING_ON_THE_AIR,
    });
  });

  it('counts only what a host hosts', async () => {
    const { host } = await twoNeighbourhoods();
    const res = await (await signIn(ctx, host)).get('/api/v1/overview');
    expect(res.body.data).toEqual({
      countsByState: { ...NO_NODES, online: 1 },
      nodeCount: 1,
      siteCount: 1,
      neighbourhoodCount: 1,
      openOutages: [],
      driftNodes: [],
      weakestLinks: [],
      ...NOTHING_ON_THE_AIR,
    });
  });

  it('shows all zeros to a host who hosts nothing, and ignores stray query parameters', async () => {
    await twoNeighbourhoods();
    const res = await (await signIn(ctx, await buildUser({ role: 'host' }))).get('/api/v1/overview?neighbourhoodId=1');
    expect(res.status).toBe(200);
    expect(res.body.data).toEqual({
      countsByState: NO_NODES,
      nodeCount: 0,
      siteCount: 0,
      neighbourhoodCount: 0,
      openOutages: [],
      driftNodes: [],
      weakestLinks: [],
      ...NOTHING_ON_THE_AIR,
    });
  });

  it('ranks live links by predicted fade margin, thinnest first, only among readable nodes', async () => {
    await truncateAll(ctx.sequelize);
    const operator = await buildUser({ role: 'operator' });
    const hood = await buildNeighbourhood({ operators: [operator] });
    const near = await buildSite({ neighbourhoodId: hood.id, latitude: 47.6, longitude: -38.4 });
    const mid = await buildSite({ neighbourhoodId: hood.id, latitude: 47.61, longitude: -38.4 });
    const far = await buildSite({ neighbourhoodId: hood.id, latitude: 47.65, longitude: -38.4 });
    const [a, b, c] = await Promise.all([near, mid, far].map((s) => buildNode({ siteId: s.id })));
    const [ra, rb, rc, ra2] = await Promise.all([
      buildRadio({ nodeId: a.id }),
      buildRadio({ nodeId: b.id }),
      buildRadio({ nodeId: c.id }),
      buildRadio({ nodeId: a.id, iface: 'wlan1' }),
    ]);
    const short = await buildLink({ radioAId: ra.id, radioBId: rb.id });
    const long = await buildLink({ radioAId: ra2.id, radioBId: rc.id });
    await short.update({ status: 'live' });
    await long.update({ status: 'live' });
    const otherHood = await buildNeighbourhood();
    const [x, y] = await Promise.all([buildNode({ neighbourhoodId: otherHood.id }), buildNode({ neighbourhoodId: otherHood.id })]);
    const hidden = await buildLink({ radioAId: (await buildRadio({ nodeId: x.id })).id, radioBId: (await buildRadio({ nodeId: y.id })).id });
    await hidden.update({ status: 'live' });

    const res = await (await signIn(ctx, operator)).get('/api/v1/overview');
    const weakest = res.body.data.weakestLinks as { id: number; fadeMarginDb: number }[];
    // Free-space loss grows with distance (ITU-R P.525), so the 5.6 km link has less margin than the 1.1 km one.
    expect(weakest.map((l) => l.id)).toEqual([long.id, short.id]);
    expect(weakest[0].fadeMarginDb).toBeLessThan(weakest[1].fadeMarginDb);
    expect(weakest[1].fadeMarginDb - weakest[0].fadeMarginDb).toBeCloseTo(20 * Math.log10(5.56 / 1.11), 0);
  });
});
