import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { Node, Radio } from '../../server/models';
import { buildUser, call, ids, SIGNED_OUT, signIn, useApi } from '../helpers/api';
import { buildNeighbourhood, buildNode, buildRadio, buildSite } from '../helpers/factories';

const MANAGE = 'Only admins and the operators of its neighbourhood change this node.';
const UPLINK = 'Only admins mark which nodes carry the uplink.';

describe('nodes API', () => {
  const ctx = useApi();
  const admin = async () => signIn(ctx, await buildUser({ role: 'admin' }));
  /** An operator with a neighbourhood of their own and a site in it. */
  async function operatorWithSite() {
    const user = await buildUser({ role: 'operator' });
    const hood = await buildNeighbourhood({ operators: [user] });
    const site = await buildSite({ neighbourhoodId: hood.id });
    return { user, hood, site, agent: await signIn(ctx, user) };
  }

  describe('signed out', () => {
    it.each([
      ['lists', 'get', '/api/v1/nodes'],
      ['reads', 'get', '/api/v1/nodes/1'],
      ['creates', 'post', '/api/v1/nodes'],
      ['updates', 'patch', '/api/v1/nodes/1'],
      ['deletes', 'delete', '/api/v1/nodes/1'],
    ] as const)('a signed-out caller who %s nodes gets 401', async (_what, method, url) => {
      const res = await call(request(ctx.app), method, url, method === 'post' || method === 'patch' ? { name: 'n', siteId: 1 } : undefined);
      expect(res.status).toBe(401);
      expect(res.body).toEqual({ error: SIGNED_OUT });
    });
  });

  describe('invalid input', () => {
    it.each([
      ['name', '', 'name must not be empty'],
      ['name', undefined, 'name is required'],
      ['siteId', 'roof', 'siteId must be a number'],
      ['neighbourhoodId', -1, 'neighbourhoodId must be a positive id'],
      ['reportIntervalS', 5, 'reportIntervalS must be at least 10 s'],
      ['reportIntervalS', 3601, 'reportIntervalS must be at most 3600 s'],
      ['reportIntervalS', 30.5, 'reportIntervalS must be a whole number of seconds'],
      ['managementAddress', '300.1.1.1', 'managementAddress must be an IPv4 address like 10.20.1.1'],
      ['managementAddress', '10.0.0', 'managementAddress must be an IPv4 address like 10.20.1.1'],
      ['hardware', 'h'.repeat(121), 'hardware must be at most 120 characters'],
      ['isUplink', 'yes', 'isUplink must be true or false'],
    ])('creating a node with %s = %j answers 400 "%s"', async (field, value, message) => {
      const site = await buildSite();
      const res = await call(await admin(), 'post', '/api/v1/nodes', { name: 'Granary', siteId: site.id, [field]: value });
      expect(res.status).toBe(400);
      expect(res.body.error).toEqual({ code: 'invalid_input', message: `The request body is invalid: ${message}.`, details: [{ path: field, message }] });
    });

    it('refuses a report interval of 5 s on update and keeps the old one', async () => {
      const node = await buildNode();
      const res = await call(await admin(), 'patch', `/api/v1/nodes/${node.id}`, { reportIntervalS: 5 });
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([{ path: 'reportIntervalS', message: 'reportIntervalS must be at least 10 s' }]);
      expect((await Node.findByPk(node.id))!.reportIntervalS).toBe(60);
    });

    it.each(['get', 'patch', 'delete'] as const)('answers 400 to %s with a non-numeric id in the path', async (method) => {
      const res = await call(await admin(), method, '/api/v1/nodes/node-7', method === 'patch' ? { name: 'x' } : undefined);
      expect(res.status).toBe(400);
      expect(res.body.error).toEqual({
        code: 'invalid_input',
        message: 'The address is invalid: id must be a number.',
        details: [{ path: 'id', message: 'id must be a number' }],
      });
    });

    it.each([
      ['state=asleep', 'The query is invalid: state must be one of online, degraded, offline, maintenance, unknown, stranded.', 'state'],
      ['pageSize=501', 'The query is invalid: pageSize must be at most 500.', 'pageSize'],
      ['sort=-colour', 'Cannot sort by "colour". Sort by one of: name, state, neighbourhoodId, siteId, lastSeenAt, reportIntervalS, createdAt, id.', 'sort'],
    ])('refuses the list query %s with 400', async (query, message, path) => {
      const res = await (await admin()).get(`/api/v1/nodes?${query}`);
      expect(res.status).toBe(400);
      expect(res.body.error.message).toBe(message);
      expect(res.body.error.details.map((d: { path: string }) => d.path)).toEqual([path]);
    });
  });

  describe('who may do what', () => {
    it('hides a node from an operator of another neighbourhood (404 to read, change or remove)', async () => {
      const { agent } = await operatorWithSite();
      const node = await buildNode();
      for (const method of ['get', 'patch', 'delete'] as const) {
        const res = await call(agent, method, `/api/v1/nodes/${node.id}`, method === 'patch' ? { name: 'taken-over' } : undefined);
        expect(res.status).toBe(404);
        expect(res.body.error).toEqual({ code: 'not_found', message: `Node ${node.id} was not found.` });
      }
    });

    it('lets the host of its site read a node, but not change or remove it (403)', async () => {
      const host = await buildUser({ role: 'host' });
      const node = await buildNode({ siteId: (await buildSite({ hostUserId: host.id })).id });
      const agent = await signIn(ctx, host);
      const read = await agent.get(`/api/v1/nodes/${node.id}`);
      expect(read.status).toBe(200);
      expect(read.body.data.abilities).toEqual({ update: false, delete: false });
      for (const method of ['patch', 'delete'] as const) {
        const res = await call(agent, method, `/api/v1/nodes/${node.id}`, method === 'patch' ? { reportIntervalS: 120 } : undefined);
        expect(res.status).toBe(403);
        expect(res.body.error).toEqual({ code: 'forbidden', message: MANAGE });
      }
      expect(await Node.findByPk(node.id)).toMatchObject({ reportIntervalS: 60 });
    });

    it('answers 403 when a host adds a node to the site they host, 404 when anyone adds one to a site they cannot see', async () => {
      const host = await buildUser({ role: 'host' });
      const hosted = await buildSite({ hostUserId: host.id });
      const forbidden = await call(await signIn(ctx, host), 'post', '/api/v1/nodes', { name: 'porch-node', siteId: hosted.id });
      expect(forbidden.status).toBe(403);
      expect(forbidden.body.error).toEqual({ code: 'forbidden', message: 'Only admins and the operators of that neighbourhood add nodes to it.' });
      const { agent } = await operatorWithSite();
      const hidden = await call(agent, 'post', '/api/v1/nodes', { name: 'porch-node', siteId: hosted.id });
      expect(hidden.status).toBe(404);
      expect(hidden.body.error).toEqual({ code: 'not_found', message: `Site ${hosted.id} was not found.` });
      expect(await Node.count({ where: { siteId: hosted.id } })).toBe(0);
    });

    it('answers 404 when an operator puts their node into a neighbourhood they cannot see', async () => {
      const { site, agent } = await operatorWithSite();
      const other = await buildNeighbourhood();
      const res = await call(agent, 'post', '/api/v1/nodes', { name: 'stray', siteId: site.id, neighbourhoodId: other.id });
      expect(res.status).toBe(404);
      expect(res.body.error.message).toBe(`Neighbourhood ${other.id} was not found.`);
    });

    it('hides every node from a host who hosts nothing', async () => {
      await buildNode();
      const res = await (await signIn(ctx, await buildUser({ role: 'host' }))).get('/api/v1/nodes');
      expect(res.body).toEqual({ data: [], pagination: { page: 1, pageSize: 50, total: 0 }, abilities: { create: false } });
    });
  });

  describe('the uplink flag', () => {
    it('refuses an operator who marks a new node as an uplink (403)', async () => {
      const { site, agent } = await operatorWithSite();
      const res = await call(agent, 'post', '/api/v1/nodes', { name: 'upstream-1', siteId: site.id, isUplink: true });
      expect(res.status).toBe(403);
      expect(res.body.error).toEqual({ code: 'forbidden', message: UPLINK });
      expect(await Node.count({ where: { siteId: site.id } })).toBe(0);
    });

    it('accepts an operator’s new node whose form says "not an uplink"', async () => {
      const { site, agent } = await operatorWithSite();
      const res = await call(agent, 'post', '/api/v1/nodes', { name: 'plain-node', siteId: site.id, isUplink: false });
      expect(res.status).toBe(201);
      expect(res.body.data.isUplink).toBe(false);
    });

    it('refuses an operator who flips the flag on an existing node (403), but not an edit that leaves it alone', async () => {
      const { site, agent } = await operatorWithSite();
      const node = await buildNode({ siteId: site.id });
      const flip = await call(agent, 'patch', `/api/v1/nodes/${node.id}`, { isUplink: true });
      expect(flip.status).toBe(403);
      expect(flip.body.error.message).toBe(UPLINK);
      const same = await call(agent, 'patch', `/api/v1/nodes/${node.id}`, { isUplink: false, firmware: '2.1' });
      expect(same.status).toBe(200);
      expect(same.body.data).toMatchObject({ isUplink: false, firmware: '2.1' });
    });

    it('lets an admin mark and unmark an uplink', async () => {
      const agent = await admin();
      const site = await buildSite();
      const made = await call(agent, 'post', '/api/v1/nodes', { name: 'gateway', siteId: site.id, isUplink: true });
      expect(made.status).toBe(201);
      expect(made.body.data.isUplink).toBe(true);
      const unmarked = await call(agent, 'patch', `/api/v1/nodes/${made.body.data.id}`, { isUplink: false });
      expect(unmarked.body.data.isUplink).toBe(false);
    });
  });

  describe('happy paths', () => {
    it('POST {name, siteId} gives 201 and the site’s neighbourhood', async () => {
      const { site, hood, agent } = await operatorWithSite();
      const res = await call(agent, 'post', '/api/v1/nodes', { name: 'loft-node', siteId: site.id });
      expect(res.status).toBe(201);
      expect(Object.keys(res.body)).toEqual(['data']);
      expect(res.body.data).toMatchObject({
        id: expect.any(Number),
        name: 'loft-node',
        siteId: site.id,
        neighbourhoodId: hood.id,
        hardware: null,
        firmware: null,
        managementAddress: null,
        reportIntervalS: 60,
        isUplink: false,
        state: 'unknown',
        stateSince: null,
        lastSeenAt: null,
        abilities: { update: true, delete: true },
      });
    });

    it('lets an admin place a node in a neighbourhood other than its site’s', async () => {
      const site = await buildSite();
      const other = await buildNeighbourhood();
      const res = await call(await admin(), 'post', '/api/v1/nodes', { name: 'border-node', siteId: site.id, neighbourhoodId: other.id, reportIntervalS: 30 });
      expect(res.status).toBe(201);
      expect(res.body.data).toMatchObject({ neighbourhoodId: other.id, siteId: site.id, reportIntervalS: 30 });
    });

    it('reads one node as {data} with id, name, state and lastSeenAt', async () => {
      const node = await buildNode({ name: 'bakery-node' });
      const res = await (await admin()).get(`/api/v1/nodes/${node.id}`);
      expect(res.status).toBe(200);
      expect(res.body.data).toMatchObject({ id: node.id, name: 'bakery-node', state: 'unknown', lastSeenAt: null });
    });

    it('changes only what is sent: setting firmware keeps a 120 s report interval', async () => {
      const node = await buildNode();
      await node.update({ reportIntervalS: 120, managementAddress: '10.20.1.1' });
      const res = await call(await admin(), 'patch', `/api/v1/nodes/${node.id}`, { firmware: 'v3' });
      expect(res.status).toBe(200);
      expect(res.body.data).toMatchObject({ firmware: 'v3', reportIntervalS: 120, managementAddress: '10.20.1.1' });
    });

    it('removes a node with 204, taking its radios with it', async () => {
      const radio = await buildRadio();
      const agent = await admin();
      const res = await call(agent, 'delete', `/api/v1/nodes/${radio.nodeId}`);
      expect(res.status).toBe(204);
      expect(await Radio.findByPk(radio.id)).toBeNull();
      expect((await agent.get(`/api/v1/nodes/${radio.nodeId}`)).status).toBe(404);
    });

    it('refuses the same node name twice across the network, whatever the case (409)', async () => {
      const agent = await admin();
      await buildNode({ name: 'church-tower' });
      const site = await buildSite();
      const res = await call(agent, 'post', '/api/v1/nodes', { name: 'Church-Tower', siteId: site.id });
      expect(res.status).toBe(409);
      expect(res.body.error).toEqual({
        code: 'duplicate',
        message: 'A node named "Church-Tower" already exists; node names are unique across the network. Choose another name.',
      });
    });
  });

  describe('pagination, sorting, filters and search on the server', () => {
    it('pageSize=2&sort=-name within a site gives the right two and a total of 3', async () => {
      const site = await buildSite();
      const [a, b, c] = [
        await buildNode({ siteId: site.id, name: 'aa-node' }),
        await buildNode({ siteId: site.id, name: 'bb-node' }),
        await buildNode({ siteId: site.id, name: 'cc-node' }),
      ];
      await buildNode();
      const agent = await admin();
      const res = await agent.get(`/api/v1/nodes?siteId=${site.id}&pageSize=2&sort=-name`);
      expect(ids(res.body)).toEqual([c.id, b.id]);
      expect(res.body.pagination).toEqual({ page: 1, pageSize: 2, total: 3 });
      expect(ids((await agent.get(`/api/v1/nodes?siteId=${site.id}&pageSize=2&page=2&sort=-name`)).body)).toEqual([a.id]);
    });

    it('filters by state and neighbourhood, and searches hardware with q', async () => {
      const hood = await buildNeighbourhood();
      const offline = await buildNode({ neighbourhoodId: hood.id });
      await offline.update({ state: 'offline', hardware: 'Rooftop Dish X2' });
      const online = await buildNode({ neighbourhoodId: hood.id });
      await online.update({ state: 'online' });
      const agent = await admin();
      expect(ids((await agent.get(`/api/v1/nodes?neighbourhoodId=${hood.id}&state=offline`)).body)).toEqual([offline.id]);
      expect(ids((await agent.get(`/api/v1/nodes?neighbourhoodId=${hood.id}&q=dish%20x2`)).body)).toEqual([offline.id]);
      const byState = await agent.get(`/api/v1/nodes?neighbourhoodId=${hood.id}&sort=-state`);
      expect(byState.body.data.map((n: { state: string }) => n.state)).toEqual(['online', 'offline']);
    });

    it('an operator’s list holds only their neighbourhood’s nodes', async () => {
      const { site, agent } = await operatorWithSite();
      const mine = await buildNode({ siteId: site.id });
      await buildNode();
      const res = await agent.get('/api/v1/nodes');
      expect(ids(res.body)).toEqual([mine.id]);
      expect(res.body.abilities).toEqual({ create: true });
    });
  });
});
