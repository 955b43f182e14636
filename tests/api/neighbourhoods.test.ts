import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { Neighbourhood } from '../../server/models';
import { buildUser, call, ids, SIGNED_OUT, signIn, useApi } from '../helpers/api';
import { buildNeighbourhood, buildNode, buildOperatorWithHood, buildSite } from '../helpers/factories';

describe('neighbourhoods API', () => {
  const ctx = useApi();
  const admin = async () => signIn(ctx, await buildUser({ role: 'admin' }));
  const operatorWithHood = () => buildOperatorWithHood(ctx);

  describe('signed out', () => {
    it.each([
      ['lists', 'get', '/api/v1/neighbourhoods'],
      ['reads', 'get', '/api/v1/neighbourhoods/1'],
      ['creates', 'post', '/api/v1/neighbourhoods'],
      ['updates', 'patch', '/api/v1/neighbourhoods/1'],
      ['deletes', 'delete', '/api/v1/neighbourhoods/1'],
      ['assigns operators to', 'put', '/api/v1/neighbourhoods/1/operators'],
    ] as const)('a signed-out caller who %s neighbourhoods gets 401', async (_what, method, url) => {
      const res = await call(request(ctx.app), method, url, method === 'get' || method === 'delete' ? undefined : { name: 'Quayside', userIds: [] });
      expect(res.status).toBe(401);
      expect(res.body).toEqual({ error: SIGNED_OUT });
    });
  });

  describe('invalid input', () => {
    it.each([
      [{ name: '' }, 'name', 'name must not be empty'],
      [{}, 'name', 'name is required'],
      [{ name: 'N'.repeat(121) }, 'name', 'name must be at most 120 characters'],
      [{ name: 'Quay\tside' }, 'name', 'name must not contain control characters or line breaks'],
      [{ name: 'Quayside', description: 'd'.repeat(2001) }, 'description', 'description must be at most 2000 characters'],
      [{ name: 42 }, 'name', 'name must be text'],
    ])('creating %j answers 400 at %s: "%s"', async (body, path, message) => {
      const res = await call(await admin(), 'post', '/api/v1/neighbourhoods', body);
      expect(res.status).toBe(400);
      expect(res.body.error).toEqual({ code: 'invalid_input', message: `The request body is invalid: ${message}.`, details: [{ path, message }] });
    });

    it('refuses an empty name on update too', async () => {
      const hood = await buildNeighbourhood({ name: 'Lantern Row' });
      const res = await call(await admin(), 'patch', `/api/v1/neighbourhoods/${hood.id}`, { name: ' ' });
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([{ path: 'name', message: 'name must not be empty' }]);
      expect((await Neighbourhood.findByPk(hood.id))!.name).toBe('Lantern Row');
    });

    it.each(['get', 'patch', 'delete'] as const)('answers 400 to %s with a non-numeric id in the path', async (method) => {
      const res = await call(await admin(), method, '/api/v1/neighbourhoods/north', method === 'patch' ? { name: 'X' } : undefined);
      expect(res.status).toBe(400);
      expect(res.body.error).toEqual({
        code: 'invalid_input',
        message: 'The address is invalid: id must be a number.',
        details: [{ path: 'id', message: 'id must be a number' }],
      });
    });

    it.each([
      [
        'sort=size',
        'Cannot sort by "size". Sort by one of: name, createdAt, id.',
        'sort',
        'sort must be one of name, createdAt, id (prefix with - for descending)',
      ],
      ['pageSize=501', 'The query is invalid: pageSize must be at most 500.', 'pageSize', 'pageSize must be at most 500'],
      [
        'sort=name;drop',
        'The query is invalid: sort must be a field name, optionally prefixed with -.',
        'sort',
        'sort must be a field name, optionally prefixed with -',
      ],
    ])('refuses the list query %s with 400', async (query, message, path, detail) => {
      const res = await (await admin()).get(`/api/v1/neighbourhoods?${query}`);
      expect(res.status).toBe(400);
      expect(res.body.error).toEqual({ code: 'invalid_input', message, details: [{ path, message: detail }] });
    });

    it('refuses to assign people who are not active operators, naming them', async () => {
      const hood = await buildNeighbourhood();
      const host = await buildUser({ role: 'host' });
      const operator = await buildUser({ role: 'operator' });
      const res = await call(await admin(), 'put', `/api/v1/neighbourhoods/${hood.id}/operators`, { userIds: [operator.id, host.id] });
      expect(res.status).toBe(400);
      expect(res.body.error).toEqual({
        code: 'invalid_input',
        message: `People ${host.id} are not active operators.`,
        details: [{ path: 'userIds', message: `userIds ${host.id} are not active operators` }],
      });
    });
  });

  describe('who may do what', () => {
    it('lets an operator read their neighbourhood but not create, change, remove or staff one (403)', async () => {
      const { hood, agent } = await operatorWithHood();
      expect((await agent.get(`/api/v1/neighbourhoods/${hood.id}`)).status).toBe(200);
      for (const [method, url, body, message] of [
        ['post', '/api/v1/neighbourhoods', { name: 'Upper Mill' }, 'Only admins create neighbourhoods.'],
        ['patch', `/api/v1/neighbourhoods/${hood.id}`, { name: 'Renamed' }, 'Only admins change neighbourhoods.'],
        ['delete', `/api/v1/neighbourhoods/${hood.id}`, undefined, 'Only admins remove neighbourhoods.'],
        ['put', `/api/v1/neighbourhoods/${hood.id}/operators`, { userIds: [] }, 'Only admins assign operators.'],
      ] as const) {
        const res = await call(agent, method, url, body);
        expect(res.status).toBe(403);
        expect(res.body.error).toEqual({ code: 'forbidden', message });
      }
      expect((await Neighbourhood.findByPk(hood.id))!.name).toBe(hood.name);
    });

    it('hides a neighbourhood from an operator of another one (404 to read, change or remove)', async () => {
      const { agent } = await operatorWithHood();
      const other = await buildNeighbourhood();
      for (const method of ['get', 'patch', 'delete'] as const) {
        const res = await call(agent, method, `/api/v1/neighbourhoods/${other.id}`, method === 'patch' ? { name: 'Mine' } : undefined);
        expect(res.status).toBe(404);
        expect(res.body.error).toEqual({ code: 'not_found', message: `Neighbourhood ${other.id} was not found.` });
      }
    });

    it('lets the host of a site read that site’s neighbourhood, and hides the rest', async () => {
      const host = await buildUser({ role: 'host' });
      const site = await buildSite({ hostUserId: host.id });
      const other = await buildNeighbourhood();
      const agent = await signIn(ctx, host);
      const read = await agent.get(`/api/v1/neighbourhoods/${site.neighbourhoodId}`);
      expect(read.status).toBe(200);
      expect(read.body.data.abilities).toEqual({ update: false, delete: false });
      expect((await agent.get(`/api/v1/neighbourhoods/${other.id}`)).status).toBe(404);
      const list = await agent.get('/api/v1/neighbourhoods');
      expect(ids(list.body)).toEqual([site.neighbourhoodId]);
      expect(list.body.abilities).toEqual({ create: false });
    });

    it('hides every neighbourhood from a host who hosts nothing', async () => {
      await buildNeighbourhood();
      const res = await (await signIn(ctx, await buildUser({ role: 'host' }))).get('/api/v1/neighbourhoods');
      expect(res.status).toBe(200);
      expect(res.body.data).toEqual([]);
      expect(res.body.pagination.total).toBe(0);
    });
  });

  describe('happy paths', () => {
    it('creates a neighbourhood: 201 with the whole record', async () => {
      const res = await call(await admin(), 'post', '/api/v1/neighbourhoods', { name: '  Quayside  ', description: 'Harbour flats' });
      expect(res.status).toBe(201);
      expect(res.body).toEqual({
        data: {
          id: expect.any(Number),
          name: 'Quayside',
          description: 'Harbour flats',
          operatorIds: [],
          siteCount: 0,
          nodeCount: 0,
          retiredAt: null,
          createdAt: expect.stringMatching(/Z$/),
          updatedAt: expect.stringMatching(/Z$/),
          abilities: { update: true, delete: true },
        },
      });
    });

    it('reads one with its operators and counts of sites and nodes', async () => {
      const operator = await buildUser({ role: 'operator' });
      const hood = await buildNeighbourhood({ operators: [operator] });
      const site = await buildSite({ neighbourhoodId: hood.id });
      await buildNode({ siteId: site.id });
      await buildNode({ siteId: site.id });
      const res = await (await admin()).get(`/api/v1/neighbourhoods/${hood.id}`);
      expect(res.status).toBe(200);
      expect(res.body.data).toMatchObject({ id: hood.id, operatorIds: [operator.id], siteCount: 1, nodeCount: 2 });
    });

    it('renames with 200 and keeps the description', async () => {
      const hood = await Neighbourhood.create({ name: 'Old Name', description: 'Keep me' });
      const res = await call(await admin(), 'patch', `/api/v1/neighbourhoods/${hood.id}`, { name: 'New Name' });
      expect(res.status).toBe(200);
      expect(res.body.data).toMatchObject({ name: 'New Name', description: 'Keep me' });
    });

    it('removes an empty neighbourhood with 204', async () => {
      const hood = await buildNeighbourhood();
      const agent = await admin();
      const res = await call(agent, 'delete', `/api/v1/neighbourhoods/${hood.id}`);
      expect(res.status).toBe(204);
      expect(res.text).toBe('');
      expect((await agent.get(`/api/v1/neighbourhoods/${hood.id}`)).status).toBe(404);
    });

    it('assigns operators, who can then see the neighbourhood', async () => {
      const hood = await buildNeighbourhood();
      const operator = await buildUser({ role: 'operator' });
      const opAgent = await signIn(ctx, operator);
      expect((await opAgent.get(`/api/v1/neighbourhoods/${hood.id}`)).status).toBe(404);
      const res = await call(await admin(), 'put', `/api/v1/neighbourhoods/${hood.id}/operators`, { userIds: [operator.id, operator.id] });
      expect(res.status).toBe(200);
      expect(res.body.data.operatorIds).toEqual([operator.id]);
      // Scopes are loaded per request, so the same session sees the change at once.
      expect((await opAgent.get(`/api/v1/neighbourhoods/${hood.id}`)).status).toBe(200);
    });

    it('lists with {data, pagination, abilities}; admins may create, operators may not', async () => {
      const { hood, agent } = await operatorWithHood();
      const mine = await agent.get('/api/v1/neighbourhoods');
      expect(mine.status).toBe(200);
      expect(mine.body).toEqual({
        data: [expect.objectContaining({ id: hood.id, name: hood.name, abilities: { update: false, delete: false } })],
        pagination: { page: 1, pageSize: 50, total: 1 },
        abilities: { create: false },
      });
      expect((await (await admin()).get('/api/v1/neighbourhoods')).body.abilities).toEqual({ create: true });
    });
  });

  describe('duplicates and records in use', () => {
    it('refuses the same name twice, whatever the case (409)', async () => {
      const agent = await admin();
      expect((await call(agent, 'post', '/api/v1/neighbourhoods', { name: 'Tannery Lane' })).status).toBe(201);
      const res = await call(agent, 'post', '/api/v1/neighbourhoods', { name: 'TANNERY lane' });
      expect(res.status).toBe(409);
      expect(res.body.error).toEqual({ code: 'duplicate', message: 'A neighbourhood named "TANNERY lane" already exists. Choose another name.' });
    });

    it('refuses renaming onto another neighbourhood’s name (409)', async () => {
      await buildNeighbourhood({ name: 'Bell Yard' });
      const hood = await buildNeighbourhood();
      const res = await call(await admin(), 'patch', `/api/v1/neighbourhoods/${hood.id}`, { name: 'bell yard' });
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('duplicate');
    });

    it('will not remove a neighbourhood that still has sites and nodes (409, says what to do)', async () => {
      const node = await buildNode();
      const res = await call(await admin(), 'delete', `/api/v1/neighbourhoods/${node.neighbourhoodId}`);
      expect(res.status).toBe(409);
      expect(res.body.error).toEqual({ code: 'in_use', message: 'This neighbourhood still has 1 site and 1 node. Move or remove them first.' });
      expect(await Neighbourhood.findByPk(node.neighbourhoodId)).not.toBeNull();
    });
  });

  describe('pagination, sorting and search on the server', () => {
    it('pageSize=2&sort=-name gives the right two and the total; q narrows by name', async () => {
      const tag = `t${Date.now()}`;
      const [a, b, c] = [
        await buildNeighbourhood({ name: `${tag} Ashgrove` }),
        await buildNeighbourhood({ name: `${tag} Brookside` }),
        await buildNeighbourhood({ name: `${tag} Copperfield` }),
      ];
      const agent = await admin();
      const page1 = await agent.get(`/api/v1/neighbourhoods?q=${tag}&pageSize=2&sort=-name`);
      expect(ids(page1.body)).toEqual([c.id, b.id]);
      expect(page1.body.pagination).toEqual({ page: 1, pageSize: 2, total: 3 });
      const page2 = await agent.get(`/api/v1/neighbourhoods?q=${tag}&pageSize=2&page=2&sort=-name`);
      expect(ids(page2.body)).toEqual([a.id]);
      const search = await agent.get(`/api/v1/neighbourhoods?q=${tag.toUpperCase()}%20brook`);
      expect(ids(search.body)).toEqual([b.id]);
    });
  });
});
