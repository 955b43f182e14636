import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { Node, Outage } from '../../server/models';
import { buildUser, call, signIn, unique, useApi } from '../helpers/api';
import { manualClock } from '../helpers/clock';
import { buildNeighbourhood, buildNode, buildSite } from '../helpers/factories';

const clock = manualClock('2026-06-01T12:00:00Z');

describe('neighbourhoods: retiring, moving nodes in bulk, and the summary', () => {
  const ctx = useApi({ now: clock.now });
  const admin = async () => signIn(ctx, await buildUser({ role: 'admin' }));

  it('retires a neighbourhood (kept, hidden from the default list) and brings it back', async () => {
    const agent = await admin();
    const hood = await buildNeighbourhood({ name: unique('Old Mill Lane') });
    const res = await call(agent, 'patch', `/api/v1/neighbourhoods/${hood.id}`, { retired: true });
    expect(res.status).toBe(200);
    expect(res.body.data.retiredAt).toMatch(/Z$/);
    const ids = async (query: string) => (await agent.get(`/api/v1/neighbourhoods?pageSize=500${query}`)).body.data.map((n: { id: number }) => n.id);
    expect(await ids('')).not.toContain(hood.id);
    expect(await ids('&retired=true')).toContain(hood.id);
    expect(await ids('&retired=all')).toContain(hood.id);
    expect((await agent.get(`/api/v1/neighbourhoods/${hood.id}`)).status).toBe(200);
    const back = await call(agent, 'patch', `/api/v1/neighbourhoods/${hood.id}`, { retired: false });
    expect(back.body.data.retiredAt).toBeNull();
    expect(await ids('')).toContain(hood.id);
  });

  it('answers 400 to retired: "yes" and to retired=maybe in the list', async () => {
    const agent = await admin();
    const hood = await buildNeighbourhood();
    const bad = await call(agent, 'patch', `/api/v1/neighbourhoods/${hood.id}`, { retired: 'yes' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details).toEqual([{ path: 'retired', message: 'retired must be true or false' }]);
    expect((await agent.get('/api/v1/neighbourhoods?retired=maybe')).status).toBe(400);
  });

  it('only admins retire (403 for the neighbourhood’s own operator)', async () => {
    const operator = await buildUser({ role: 'operator' });
    const hood = await buildNeighbourhood({ operators: [operator] });
    const res = await call(await signIn(ctx, operator), 'patch', `/api/v1/neighbourhoods/${hood.id}`, { retired: true });
    expect(res.status).toBe(403);
  });

  describe('POST /neighbourhoods/:id/nodes', () => {
    it('moves the named nodes in one go and records each move', async () => {
      const agent = await admin();
      const from = await buildNeighbourhood();
      const to = await buildNeighbourhood();
      const a = await buildNode({ neighbourhoodId: from.id });
      const b = await buildNode({ neighbourhoodId: from.id });
      const already = await buildNode({ neighbourhoodId: to.id });
      const res = await call(agent, 'post', `/api/v1/neighbourhoods/${to.id}/nodes`, { nodeIds: [a.id, b.id, already.id, a.id] });
      expect(res.status).toBe(200);
      expect(res.body.data).toEqual({ neighbourhoodId: to.id, moved: 2, unchanged: 1 });
      expect((await Node.findAll({ where: { id: [a.id, b.id] } })).map((n) => n.neighbourhoodId)).toEqual([to.id, to.id]);
      const history = await agent.get(`/api/v1/history?table=nodes&recordId=${a.id}`);
      expect(history.body.data[0]).toMatchObject({ before: { neighbourhoodId: from.id }, after: { neighbourhoodId: to.id } });
    });

    it('answers 401, 403, 404, 400 and 409 as it should, and moves nothing when one id is wrong', async () => {
      const operator = await buildUser({ role: 'operator' });
      const hood = await buildNeighbourhood({ operators: [operator] });
      const node = await buildNode();
      expect(
        (
          await request(ctx.app)
            .post(`/api/v1/neighbourhoods/${hood.id}/nodes`)
            .send({ nodeIds: [node.id] })
        ).status,
      ).toBe(401);
      const forbidden = await call(await signIn(ctx, operator), 'post', `/api/v1/neighbourhoods/${hood.id}/nodes`, { nodeIds: [node.id] });
      expect(forbidden.status).toBe(403);
      expect(forbidden.body.error.message).toBe('Only admins move nodes between neighbourhoods.');
      const host = await buildUser({ role: 'host' });
      expect((await call(await signIn(ctx, host), 'post', `/api/v1/neighbourhoods/${hood.id}/nodes`, { nodeIds: [node.id] })).status).toBe(404);

      const agent = await admin();
      const empty = await call(agent, 'post', `/api/v1/neighbourhoods/${hood.id}/nodes`, { nodeIds: [] });
      expect(empty.body.error.details).toEqual([{ path: 'nodeIds', message: 'nodeIds must name at least one node' }]);
      const missing = await call(agent, 'post', `/api/v1/neighbourhoods/${hood.id}/nodes`, { nodeIds: [node.id, 999999] });
      expect(missing.status).toBe(400);
      expect(missing.body.error.details).toEqual([{ path: 'nodeIds', message: 'nodeIds 999999 do not exist' }]);
      expect((await Node.findByPk(node.id))!.neighbourhoodId).not.toBe(hood.id);

      await call(agent, 'patch', `/api/v1/neighbourhoods/${hood.id}`, { retired: true });
      const retired = await call(agent, 'post', `/api/v1/neighbourhoods/${hood.id}/nodes`, { nodeIds: [node.id] });
      expect(retired.status).toBe(409);
      expect(retired.body.error.code).toBe('retired');
    });
  });

  describe('GET /neighbourhoods/:id/summary', () => {
    it('gives nodes with state and availability, operators, and each site’s host', async () => {
      const operator = await buildUser({ role: 'operator', name: 'Piran Code' });
      const host = await buildUser({ role: 'host', name: 'Jenna Rowe' });
      const hood = await buildNeighbourhood({ operators: [operator] });
      const site = await buildSite({ neighbourhoodId: hood.id, hostUserId: host.id, name: 'Net Loft' });
      await buildSite({ neighbourhoodId: hood.id, name: 'Chapel Tower' });
      // Seen for the whole 30 days; down for 6 h of the last 24 h.
      const node = await Node.create({
        name: 'nl-1',
        siteId: site.id,
        neighbourhoodId: hood.id,
        state: 'online',
        firstSeenAt: new Date('2026-04-01T00:00:00Z'),
      });
      await Outage.create({ nodeId: node.id, startedAt: new Date('2026-06-01T00:00:00Z'), endedAt: new Date('2026-06-01T06:00:00Z') } as never);

      const res = await (await admin()).get(`/api/v1/neighbourhoods/${hood.id}/summary`);
      expect(res.status).toBe(200);
      // 24 h: 18 of 24 h up = 75 %; 30 d: (720 − 6) ÷ 720 h = 99.17 % (availability = up ÷ observed, REFERENCES.md "Availability").
      expect(res.body.data.availability).toEqual({ h24Pct: 75, d30Pct: 99.17 });
      expect(res.body.data.nodes).toEqual([
        { id: node.id, name: 'nl-1', state: 'online', siteId: site.id, siteName: 'Net Loft', availability: { h24Pct: 75, d30Pct: 99.17 } },
      ]);
      expect(res.body.data.operators).toEqual([{ id: operator.id, name: 'Piran Code' }]);
      expect(res.body.data.hosts).toEqual([
        { siteId: expect.any(Number), siteName: 'Chapel Tower', host: null },
        { siteId: site.id, siteName: 'Net Loft', host: { id: host.id, name: 'Jenna Rowe' } },
      ]);
    });

    it('is 404 for a neighbourhood the caller cannot read', async () => {
      const hood = await buildNeighbourhood();
      const res = await (await signIn(ctx, await buildUser({ role: 'operator' }))).get(`/api/v1/neighbourhoods/${hood.id}/summary`);
      expect(res.status).toBe(404);
    });
  });
});
