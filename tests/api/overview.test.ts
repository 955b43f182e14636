import request from 'supertest';
import { describe, expect, it } from 'vitest';
import type { NodeState } from '../../shared/enums';
import { buildUser, signIn, truncateAll, useApi } from '../helpers/api';
import { buildNeighbourhood, buildNode, buildSite } from '../helpers/factories';

const NO_NODES: Record<NodeState, number> = { online: 0, degraded: 0, offline: 0, maintenance: 0, unknown: 0, stranded: 0 };

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
    });
  });

  it('counts only what a host hosts', async () => {
    const { host } = await twoNeighbourhoods();
    const res = await (await signIn(ctx, host)).get('/api/v1/overview');
    expect(res.body.data).toEqual({ countsByState: { ...NO_NODES, online: 1 }, nodeCount: 1, siteCount: 1, neighbourhoodCount: 1, openOutages: [], driftNodes: [] });
  });

  it('shows all zeros to a host who hosts nothing, and ignores stray query parameters', async () => {
    await twoNeighbourhoods();
    const res = await (await signIn(ctx, await buildUser({ role: 'host' }))).get('/api/v1/overview?neighbourhoodId=1');
    expect(res.status).toBe(200);
    expect(res.body.data).toEqual({ countsByState: NO_NODES, nodeCount: 0, siteCount: 0, neighbourhoodCount: 0, openOutages: [], driftNodes: [] });
  });
});
