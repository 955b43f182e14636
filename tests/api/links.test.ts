import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { Link } from '../../server/models';
import { buildUser, call, ids, SIGNED_OUT, signIn, useApi } from '../helpers/api';
import { buildLink, buildNeighbourhood, buildNode, buildOperatorWithHood, buildRadio, buildSite } from '../helpers/factories';

describe('links API', () => {
  const ctx = useApi();
  const admin = async () => signIn(ctx, await buildUser({ role: 'admin' }));
  const operatorWithHood = () => buildOperatorWithHood(ctx);

  describe('signed out', () => {
    it.each([
      ['lists', 'get', '/api/v1/links'],
      ['reads', 'get', '/api/v1/links/1'],
      ['creates', 'post', '/api/v1/links'],
      ['updates', 'patch', '/api/v1/links/1'],
      ['deletes', 'delete', '/api/v1/links/1'],
    ] as const)('a signed-out caller who %s links gets 401', async (_what, method, url) => {
      const res = await call(request(ctx.app), method, url, method === 'post' || method === 'patch' ? { radioAId: 1, radioBId: 2 } : undefined);
      expect(res.status).toBe(401);
      expect(res.body).toEqual({ error: SIGNED_OUT });
    });
  });

  describe('invalid input', () => {
    it('refuses a link from a radio to itself, at radioBId', async () => {
      const radio = await buildRadio();
      const res = await call(await admin(), 'post', '/api/v1/links', { radioAId: radio.id, radioBId: radio.id });
      expect(res.status).toBe(400);
      const message = 'radioBId must be a different radio from radioAId: a link joins two radios';
      expect(res.body.error).toEqual({ code: 'invalid_input', message: `The request body is invalid: ${message}.`, details: [{ path: 'radioBId', message }] });
      expect(await Link.count()).toBe(0);
    });

    it.each([
      [{ radioAId: 'a', radioBId: 2 }, 'radioAId', 'radioAId must be a number'],
      [{ radioAId: 1, radioBId: 2, status: 'broken' }, 'status', 'status must be one of planned, live'],
      [{ radioAId: 1, radioBId: 2, name: '' }, 'name', 'name must not be empty'],
    ])('creating %j answers 400 at %s', async (body, path, message) => {
      const res = await call(await admin(), 'post', '/api/v1/links', body);
      expect(res.status).toBe(400);
      expect(res.body.error).toEqual({ code: 'invalid_input', message: `The request body is invalid: ${message}.`, details: [{ path, message }] });
    });

    it('refuses an unknown status on update', async () => {
      const link = await buildLink();
      const res = await call(await admin(), 'patch', `/api/v1/links/${link.id}`, { status: 'up' });
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([{ path: 'status', message: 'status must be one of planned, live' }]);
    });

    it.each(['get', 'patch', 'delete'] as const)('answers 400 to %s with a non-numeric id in the path', async (method) => {
      const res = await call(await admin(), method, '/api/v1/links/ridge', method === 'patch' ? { status: 'live' } : undefined);
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([{ path: 'id', message: 'id must be a number' }]);
    });

    it.each([
      ['sort=distanceKm', 'Cannot sort by "distanceKm". Sort by one of: name, status, createdAt, id.'],
      ['pageSize=501', 'The query is invalid: pageSize must be at most 500.'],
      ['status=up', 'The query is invalid: status must be one of planned, live.'],
      ['nodeId=x', 'The query is invalid: nodeId must be a number.'],
    ])('refuses the list query %s with 400', async (query, message) => {
      const res = await (await admin()).get(`/api/v1/links?${query}`);
      expect(res.status).toBe(400);
      expect(res.body.error.message).toBe(message);
    });
  });

  describe('who may do what', () => {
    it('shows an operator the links touching their neighbourhood, including those crossing into another', async () => {
      const { hood, agent } = await operatorWithHood();
      const inside = await buildLink({ neighbourhoodId: hood.id });
      const outbound = await buildLink({ radioAId: (await buildRadio({ neighbourhoodId: hood.id })).id });
      const elsewhere = await buildLink();
      const list = await agent.get('/api/v1/links');
      expect(ids(list.body).sort()).toEqual([inside.id, outbound.id].sort());
      expect((await agent.get(`/api/v1/links/${outbound.id}`)).body.data.abilities).toEqual({ update: true, delete: true });
      for (const method of ['get', 'patch', 'delete'] as const) {
        const res = await call(agent, method, `/api/v1/links/${elsewhere.id}`, method === 'patch' ? { status: 'live' } : undefined);
        expect(res.status).toBe(404);
        expect(res.body.error).toEqual({ code: 'not_found', message: `Link ${elsewhere.id} was not found.` });
      }
    });

    it('hides links from hosts, even between radios on the site they host', async () => {
      const host = await buildUser({ role: 'host' });
      const site = await buildSite({ hostUserId: host.id });
      const [a, b] = [
        await buildRadio({ nodeId: (await buildNode({ siteId: site.id })).id }),
        await buildRadio({ nodeId: (await buildNode({ siteId: site.id })).id }),
      ];
      const link = await buildLink({ radioAId: a.id, radioBId: b.id });
      const agent = await signIn(ctx, host);
      expect((await agent.get(`/api/v1/links/${link.id}`)).status).toBe(404);
      expect((await agent.get('/api/v1/links')).body).toEqual({ data: [], pagination: { page: 1, pageSize: 50, total: 0 }, abilities: { create: false } });
      // They can read both radios, so adding a link between them is refused rather than hidden.
      await Link.destroy({ where: { id: link.id } });
      const add = await call(agent, 'post', '/api/v1/links', { radioAId: a.id, radioBId: b.id });
      expect(add.status).toBe(403);
      expect(add.body.error).toEqual({ code: 'forbidden', message: 'Only admins and the operators of one of its ends add this link.' });
    });

    it('answers 404 when an operator links to a radio they cannot see', async () => {
      const { hood, agent } = await operatorWithHood();
      const mine = await buildRadio({ neighbourhoodId: hood.id });
      const hidden = await buildRadio();
      const res = await call(agent, 'post', '/api/v1/links', { radioAId: mine.id, radioBId: hidden.id });
      expect(res.status).toBe(404);
      expect(res.body.error).toEqual({ code: 'not_found', message: `Radio ${hidden.id} was not found.` });
    });
  });

  describe('happy paths', () => {
    it('adds a link: 201 with both radios and the nodes they sit on', async () => {
      const { hood, agent } = await operatorWithHood();
      const [a, b] = [await buildRadio({ neighbourhoodId: hood.id }), await buildRadio({ neighbourhoodId: hood.id })];
      const res = await call(agent, 'post', '/api/v1/links', { name: 'Mill to Chapel', radioAId: a.id, radioBId: b.id });
      expect(res.status).toBe(201);
      expect(res.body).toEqual({
        data: {
          id: expect.any(Number),
          name: 'Mill to Chapel',
          radioAId: a.id,
          radioBId: b.id,
          nodeAId: a.nodeId,
          nodeBId: b.nodeId,
          status: 'planned',
          createdAt: expect.stringMatching(/Z$/),
          updatedAt: expect.stringMatching(/Z$/),
          abilities: { update: true, delete: true },
        },
      });
    });

    it('reads, goes live with 200, and is removed with 204', async () => {
      const link = await buildLink();
      const agent = await admin();
      const read = await agent.get(`/api/v1/links/${link.id}`);
      expect(read.status).toBe(200);
      expect(read.body.data).toMatchObject({ id: link.id, status: 'planned' });
      const live = await call(agent, 'patch', `/api/v1/links/${link.id}`, { status: 'live', name: 'Ridge hop' });
      expect(live.status).toBe(200);
      expect(live.body.data).toMatchObject({ status: 'live', name: 'Ridge hop', radioAId: link.radioAId });
      const gone = await call(agent, 'delete', `/api/v1/links/${link.id}`);
      expect(gone.status).toBe(204);
      expect(await Link.findByPk(link.id)).toBeNull();
    });

    it('refuses linking the same two radios twice, in either order (409)', async () => {
      const link = await buildLink();
      const agent = await admin();
      const res = await call(agent, 'post', '/api/v1/links', { radioAId: link.radioBId, radioBId: link.radioAId });
      expect(res.status).toBe(409);
      expect(res.body.error).toEqual({
        code: 'duplicate',
        message: `Radios ${link.radioBId} and ${link.radioAId} are already linked. Change that link instead of adding another.`,
      });
    });
  });

  describe('pagination, sorting and filters on the server', () => {
    it('pageSize=2&sort=-name gives the right two and a total of 3; status and node filter', async () => {
      const hood = await buildNeighbourhood();
      const hub = await buildRadio({ neighbourhoodId: hood.id });
      const made: Link[] = [];
      for (const name of ['Alpha hop', 'Bravo hop', 'Charlie hop']) {
        const link = await buildLink({ radioAId: hub.id, neighbourhoodId: hood.id });
        made.push(await link.update({ name }));
      }
      await made[1].update({ status: 'live' });
      await buildLink();
      const agent = await admin();
      const page = await agent.get(`/api/v1/links?nodeId=${hub.nodeId}&pageSize=2&sort=-name`);
      expect(ids(page.body)).toEqual([made[2].id, made[1].id]);
      expect(page.body.pagination).toEqual({ page: 1, pageSize: 2, total: 3 });
      expect(ids((await agent.get(`/api/v1/links?nodeId=${hub.nodeId}&status=live`)).body)).toEqual([made[1].id]);
      expect(ids((await agent.get(`/api/v1/links?q=charlie`)).body)).toEqual([made[2].id]);
    });
  });
});
