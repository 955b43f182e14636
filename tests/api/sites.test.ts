import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { OperatorAssignment, Site } from '../../server/models';
import { buildUser, call, SIGNED_OUT, signIn, type Agent, useApi } from '../helpers/api';
import { buildNeighbourhood, buildNode, buildOperatorWithHood, buildSite } from '../helpers/factories';

const validSite = (neighbourhoodId: number, overrides: Record<string, unknown> = {}) => ({
  name: 'Granary Roof',
  neighbourhoodId,
  latitude: 47.61,
  longitude: -38.42,
  groundElevationM: 12,
  antennaHeightM: 9,
  ...overrides,
});

describe('sites API', () => {
  const ctx = useApi();

  async function admin(): Promise<Agent> {
    return signIn(ctx, await buildUser({ role: 'admin' }));
  }
  /** An operator assigned to a fresh neighbourhood, with that neighbourhood. */
  const operatorWithHood = () => buildOperatorWithHood(ctx);
  /** A site in a fresh neighbourhood, hosted by a person with a phone. */
  async function hostedSite() {
    const host = await buildUser({ role: 'host', phone: '+00 555 0101' });
    const site = await buildSite({ hostUserId: host.id });
    return { host, site };
  }

  describe('signed out', () => {
    it.each([
      ['lists', 'get', '/api/v1/sites'],
      ['reads', 'get', '/api/v1/sites/1'],
      ['creates', 'post', '/api/v1/sites'],
      ['updates', 'patch', '/api/v1/sites/1'],
      ['deletes', 'delete', '/api/v1/sites/1'],
    ] as const)('a signed-out caller who %s sites gets 401', async (_what, method, url) => {
      const res = await call(request(ctx.app), method, url, method === 'get' || method === 'delete' ? undefined : validSite(1));
      expect(res.status).toBe(401);
      expect(res.body).toEqual({ error: SIGNED_OUT });
    });
  });

  describe('invalid input', () => {
    it.each([
      ['latitude', 91, 'latitude must be between -90 and 90'],
      ['latitude', -90.5, 'latitude must be between -90 and 90'],
      ['latitude', 'north', 'latitude must be a number'],
      ['longitude', 180.01, 'longitude must be between -180 and 180'],
      ['name', '', 'name must not be empty'],
      ['name', '   ', 'name must not be empty'],
      ['name', 'x'.repeat(121), 'name must be at most 120 characters'],
      ['name', 'Roof\nTwo', 'name must not contain control characters or line breaks'],
      ['groundElevationM', 9001, 'groundElevationM must be at most 9000 m'],
      ['antennaHeightM', -1, 'antennaHeightM must be 0 m or more'],
      ['antennaHeightM', 301, 'antennaHeightM must be at most 300 m'],
      ['accessNotes', 'x'.repeat(2001), 'accessNotes must be at most 2000 characters'],
      ['neighbourhoodId', 0, 'neighbourhoodId must be a positive id'],
      ['neighbourhoodId', 'abc', 'neighbourhoodId must be a number'],
      ['hostUserId', 1.5, 'hostUserId must be a whole number'],
    ])('creating a site with %s = %j answers 400 "%s"', async (field, value, message) => {
      const agent = await admin();
      const hood = await buildNeighbourhood();
      const res = await call(agent, 'post', '/api/v1/sites', validSite(hood.id, { [field]: value }));
      expect(res.status).toBe(400);
      expect(res.body.error).toEqual({
        code: 'invalid_input',
        message: `The request body is invalid: ${message}.`,
        details: [{ path: field, message }],
      });
    });

    it('names every missing required field in details', async () => {
      const res = await call(await admin(), 'post', '/api/v1/sites', {});
      expect(res.status).toBe(400);
      expect(res.body.error.message).toBe('The request body is invalid: name is required (and 3 more).');
      expect(res.body.error.details.map((d: { path: string }) => d.path).sort()).toEqual(['latitude', 'longitude', 'name', 'neighbourhoodId']);
    });

    it('rejects a latitude of 91 on update too, and leaves the site as it was', async () => {
      const site = await buildSite({ latitude: 47.5 });
      const res = await call(await admin(), 'patch', `/api/v1/sites/${site.id}`, { latitude: 91 });
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([{ path: 'latitude', message: 'latitude must be between -90 and 90' }]);
      expect((await Site.findByPk(site.id))!.latitude).toBe(47.5);
    });

    it.each([
      ['abc', 'id must be a number'],
      ['1.5', 'id must be a whole number'],
      ['0', 'id must be a positive id'],
      ['-3', 'id must be a positive id'],
    ])('answers 400 for the site id "%s" in the path: "%s"', async (id, message) => {
      const agent = await admin();
      for (const method of ['get', 'patch', 'delete'] as const) {
        const res = await call(agent, method, `/api/v1/sites/${id}`, method === 'patch' ? { name: 'Renamed' } : undefined);
        expect(res.status).toBe(400);
        expect(res.body.error).toEqual({ code: 'invalid_input', message: `The address is invalid: ${message}.`, details: [{ path: 'id', message }] });
      }
    });

    it('refuses an unknown sort field and names the ones it accepts', async () => {
      const res = await (await admin()).get('/api/v1/sites?sort=colour');
      expect(res.status).toBe(400);
      expect(res.body.error).toEqual({
        code: 'invalid_input',
        message: 'Cannot sort by "colour". Sort by one of: name, neighbourhoodId, latitude, longitude, antennaHeightM, createdAt, id.',
        details: [
          {
            path: 'sort',
            message: 'sort must be one of name, neighbourhoodId, latitude, longitude, antennaHeightM, createdAt, id (prefix with - for descending)',
          },
        ],
      });
    });

    it.each([
      ['pageSize=501', 'pageSize', 'pageSize must be at most 500'],
      ['pageSize=0', 'pageSize', 'pageSize must be 1 or more'],
      ['page=0', 'page', 'page must be 1 or more'],
      ['page=2.5', 'page', 'page must be a whole number'],
      ['neighbourhoodId=abc', 'neighbourhoodId', 'neighbourhoodId must be a number'],
    ])('refuses the list query %s with 400 at %s', async (query, path, message) => {
      const res = await (await admin()).get(`/api/v1/sites?${query}`);
      expect(res.status).toBe(400);
      expect(res.body.error).toEqual({ code: 'invalid_input', message: `The query is invalid: ${message}.`, details: [{ path, message }] });
    });

    it('refuses a host who is not an active person', async () => {
      const agent = await admin();
      const hood = await buildNeighbourhood();
      const gone = await buildUser({ role: 'host', active: false });
      for (const hostUserId of [gone.id, 987654]) {
        const res = await call(agent, 'post', '/api/v1/sites', validSite(hood.id, { hostUserId }));
        expect(res.status).toBe(400);
        expect(res.body.error).toEqual({
          code: 'invalid_input',
          message: `Person ${hostUserId} is not an active person who can host.`,
          details: [{ path: 'hostUserId', message: 'hostUserId must be an active person' }],
        });
      }
    });
  });

  describe('who may do what', () => {
    it('hides a site from an operator of another neighbourhood (404 to read, change or remove it)', async () => {
      const { agent } = await operatorWithHood();
      const site = await buildSite();
      for (const method of ['get', 'patch', 'delete'] as const) {
        const res = await call(agent, method, `/api/v1/sites/${site.id}`, method === 'patch' ? { name: 'Mine Now' } : undefined);
        expect(res.status).toBe(404);
        expect(res.body.error).toEqual({ code: 'not_found', message: `Site ${site.id} was not found.` });
      }
      expect((await Site.findByPk(site.id))!.name).toBe(site.name);
    });

    it('lets a host read the site they host but not change or remove it (403)', async () => {
      const { host, site } = await hostedSite();
      const agent = await signIn(ctx, host);
      const read = await agent.get(`/api/v1/sites/${site.id}`);
      expect(read.status).toBe(200);
      expect(read.body.data.abilities).toEqual({ update: false, delete: false });
      const update = await call(agent, 'patch', `/api/v1/sites/${site.id}`, { accessNotes: 'Key under the mat' });
      expect(update.status).toBe(403);
      expect(update.body.error).toEqual({ code: 'forbidden', message: 'Only admins and the operators of its neighbourhood change this site.' });
      const remove = await call(agent, 'delete', `/api/v1/sites/${site.id}`);
      expect(remove.status).toBe(403);
      expect(remove.body.error).toEqual({ code: 'forbidden', message: 'Only admins and the operators of its neighbourhood remove this site.' });
      expect(await Site.findByPk(site.id)).not.toBeNull();
    });

    it('hides every site from a host who hosts nothing', async () => {
      const nobody = await signIn(ctx, await buildUser({ role: 'host' }));
      const site = await buildSite();
      expect((await nobody.get(`/api/v1/sites/${site.id}`)).status).toBe(404);
      const list = await nobody.get('/api/v1/sites');
      expect(list.status).toBe(200);
      expect(list.body.data).toEqual([]);
      expect(list.body.abilities).toEqual({ create: false });
    });

    it('answers 404 when an operator adds a site to a neighbourhood they cannot see', async () => {
      const { agent } = await operatorWithHood();
      const other = await buildNeighbourhood();
      const res = await call(agent, 'post', '/api/v1/sites', validSite(other.id));
      expect(res.status).toBe(404);
      expect(res.body.error).toEqual({ code: 'not_found', message: `Neighbourhood ${other.id} was not found.` });
    });

    it('answers 403 when a host adds a site to the neighbourhood of the site they host', async () => {
      const { host, site } = await hostedSite();
      const res = await call(await signIn(ctx, host), 'post', '/api/v1/sites', validSite(site.neighbourhoodId));
      expect(res.status).toBe(403);
      expect(res.body.error).toEqual({ code: 'forbidden', message: 'Only admins and the operators of that neighbourhood add sites to it.' });
    });

    it('stops an operator moving a site into a neighbourhood they can see but do not operate (403)', async () => {
      const { user, hood, agent } = await operatorWithHood();
      const elsewhere = await buildNeighbourhood();
      await buildSite({ neighbourhoodId: elsewhere.id, hostUserId: user.id }); // hosting lets them see that neighbourhood
      const site = await buildSite({ neighbourhoodId: hood.id });
      const res = await call(agent, 'patch', `/api/v1/sites/${site.id}`, { neighbourhoodId: elsewhere.id });
      expect(res.status).toBe(403);
      expect(res.body.error.message).toBe('You cannot move a site into a neighbourhood you do not operate.');
      expect((await Site.findByPk(site.id))!.neighbourhoodId).toBe(hood.id);
    });

    it('answers 404 for a site that does not exist, even past the range of stored ids', async () => {
      const agent = await admin();
      const missing404 = await agent.get('/api/v1/sites/424242');
      expect(missing404.status).toBe(404);
      expect(missing404.body.error).toEqual({ code: 'not_found', message: 'Site 424242 was not found.' });
      // Past PostgreSQL's integer range no record can exist: the same 404, answered before any lookup.
      const beyond = await agent.get('/api/v1/sites/99999999999');
      expect(beyond.status).toBe(404);
      expect(beyond.body.error).toEqual({ code: 'not_found', message: 'That record was not found.' });
      // A body reference beyond PostgreSQL's integer range is bad input (400 naming the field), not a lookup.
      const hood = await call(agent, 'post', '/api/v1/sites', validSite(99999999999));
      expect(hood.status).toBe(400);
      expect(hood.body.error.details).toEqual([{ path: 'neighbourhoodId', message: 'neighbourhoodId must be at most 2147483647; no record has a larger id' }]);
      const missing = await call(agent, 'post', '/api/v1/sites', validSite(2147483647));
      expect(missing.status).toBe(404);
      expect(missing.body.error.message).toBe('Neighbourhood 2147483647 was not found.');
    });
  });

  describe('happy paths', () => {
    it('lets an operator add a site to their neighbourhood: 201 with the whole record', async () => {
      const { hood, agent } = await operatorWithHood();
      const res = await call(agent, 'post', '/api/v1/sites', validSite(hood.id, { accessNotes: 'Ladder in the shed' }));
      expect(res.status).toBe(201);
      expect(res.body).toEqual({
        data: {
          id: expect.any(Number),
          name: 'Granary Roof',
          neighbourhoodId: hood.id,
          latitude: 47.61,
          longitude: -38.42,
          groundElevationM: 12,
          antennaHeightM: 9,
          accessNotes: 'Ladder in the shed',
          hostUserId: null,
          host: null,
          createdAt: expect.stringMatching(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/),
          updatedAt: expect.stringMatching(/Z$/),
          abilities: { update: true, delete: true },
        },
      });
      expect(await Site.count({ where: { id: res.body.data.id } })).toBe(1);
    });

    it('fills ground elevation and antenna height with 0 when left out', async () => {
      const hood = await buildNeighbourhood();
      const res = await call(await admin(), 'post', '/api/v1/sites', { name: 'Bare Roof', neighbourhoodId: hood.id, latitude: 1, longitude: 2 });
      expect(res.status).toBe(201);
      expect(res.body.data).toMatchObject({ groundElevationM: 0, antennaHeightM: 0 });
    });

    it('reads one site as {data}', async () => {
      const site = await buildSite({ name: 'Mill Chimney' });
      const res = await (await admin()).get(`/api/v1/sites/${site.id}`);
      expect(res.status).toBe(200);
      expect(Object.keys(res.body)).toEqual(['data']);
      expect(res.body.data).toMatchObject({ id: site.id, name: 'Mill Chimney', neighbourhoodId: site.neighbourhoodId });
    });

    it('changes only the fields sent: renaming keeps the antenna height and elevation', async () => {
      const site = await buildSite(); // the factory sets ground elevation 10 m and antenna height 8 m
      const res = await call(await admin(), 'patch', `/api/v1/sites/${site.id}`, { name: 'Renamed Roof' });
      expect(res.status).toBe(200);
      expect(res.body.data).toMatchObject({ name: 'Renamed Roof', groundElevationM: 10, antennaHeightM: 8 });
      expect((await Site.findByPk(site.id))!.antennaHeightM).toBe(8);
    });

    it('removes a site with 204 and no body; it is then gone', async () => {
      const { hood, agent } = await operatorWithHood();
      const site = await buildSite({ neighbourhoodId: hood.id });
      const res = await call(agent, 'delete', `/api/v1/sites/${site.id}`);
      expect(res.status).toBe(204);
      expect(res.text).toBe('');
      expect((await agent.get(`/api/v1/sites/${site.id}`)).status).toBe(404);
    });

    it('lists with the envelope {data, pagination, abilities}', async () => {
      const { hood, agent } = await operatorWithHood();
      const site = await buildSite({ neighbourhoodId: hood.id });
      const res = await agent.get('/api/v1/sites');
      expect(res.status).toBe(200);
      expect(Object.keys(res.body).sort()).toEqual(['abilities', 'data', 'pagination']);
      expect(res.body.pagination).toEqual({ page: 1, pageSize: 50, total: 1 });
      expect(res.body.abilities).toEqual({ create: true });
      expect(res.body.data.map((s: { id: number }) => s.id)).toEqual([site.id]);
    });
  });

  describe('duplicates and records still in use', () => {
    it('refuses the same site name twice in one neighbourhood, whatever the case (409)', async () => {
      const agent = await admin();
      const hood = await buildNeighbourhood();
      expect((await call(agent, 'post', '/api/v1/sites', validSite(hood.id, { name: 'Water Tower' }))).status).toBe(201);
      const res = await call(agent, 'post', '/api/v1/sites', validSite(hood.id, { name: 'water tower' }));
      expect(res.status).toBe(409);
      expect(res.body.error).toEqual({ code: 'duplicate', message: 'This neighbourhood already has a site named "water tower". Choose another name.' });
    });

    it('refuses renaming a site onto a name its neighbourhood already uses (409)', async () => {
      const hood = await buildNeighbourhood();
      await buildSite({ neighbourhoodId: hood.id, name: 'Clock Tower' });
      const site = await buildSite({ neighbourhoodId: hood.id });
      const res = await call(await admin(), 'patch', `/api/v1/sites/${site.id}`, { name: 'Clock Tower' });
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('duplicate');
    });

    it('allows the same site name in two neighbourhoods', async () => {
      const agent = await admin();
      const [a, b] = [await buildNeighbourhood(), await buildNeighbourhood()];
      expect((await call(agent, 'post', '/api/v1/sites', validSite(a.id, { name: 'Library' }))).status).toBe(201);
      expect((await call(agent, 'post', '/api/v1/sites', validSite(b.id, { name: 'Library' }))).status).toBe(201);
    });

    it('will not remove a site that still carries nodes (409, says what to do)', async () => {
      const node = await buildNode();
      const res = await call(await admin(), 'delete', `/api/v1/sites/${node.siteId}`);
      expect(res.status).toBe(409);
      expect(res.body.error).toEqual({ code: 'in_use', message: 'This site still carries 1 node. Move or remove its nodes first.' });
      expect(await Site.findByPk(node.siteId)).not.toBeNull();
    });
  });

  describe('pagination, sorting, filters and search on the server', () => {
    async function threeSites() {
      const hood = await buildNeighbourhood();
      const [alder, birch, cedar] = [
        await buildSite({ neighbourhoodId: hood.id, name: 'Alder House' }),
        await buildSite({ neighbourhoodId: hood.id, name: 'Birch Flats' }),
        await buildSite({ neighbourhoodId: hood.id, name: 'Cedar Court' }),
      ];
      await buildSite(); // in another neighbourhood, filtered out below
      return { hood, alder, birch, cedar };
    }

    it('pageSize=2&sort=-name gives the last two names and a total of 3', async () => {
      const { hood, birch, cedar } = await threeSites();
      const res = await (await admin()).get(`/api/v1/sites?neighbourhoodId=${hood.id}&pageSize=2&sort=-name`);
      expect(res.status).toBe(200);
      expect(res.body.data.map((s: { id: number }) => s.id)).toEqual([cedar.id, birch.id]);
      expect(res.body.pagination).toEqual({ page: 1, pageSize: 2, total: 3 });
    });

    it('page 2 holds the rest; a page past the end is empty but keeps the total', async () => {
      const { hood, alder } = await threeSites();
      const agent = await admin();
      const second = await agent.get(`/api/v1/sites?neighbourhoodId=${hood.id}&pageSize=2&page=2&sort=-name`);
      expect(second.body.data.map((s: { id: number }) => s.id)).toEqual([alder.id]);
      expect(second.body.pagination).toEqual({ page: 2, pageSize: 2, total: 3 });
      const beyond = await agent.get(`/api/v1/sites?neighbourhoodId=${hood.id}&pageSize=2&page=9`);
      expect(beyond.body.data).toEqual([]);
      expect(beyond.body.pagination.total).toBe(3);
    });

    it('sorts by a numeric field named in camelCase (antennaHeightM)', async () => {
      const hood = await buildNeighbourhood();
      const ids: number[] = [];
      for (const heightM of [30, 5, 12]) {
        const res = await call(await admin(), 'post', '/api/v1/sites', validSite(hood.id, { name: `Mast ${heightM}`, antennaHeightM: heightM }));
        ids.push(res.body.data.id);
      }
      const res = await (await admin()).get(`/api/v1/sites?neighbourhoodId=${hood.id}&sort=antennaHeightM`);
      expect(res.status).toBe(200);
      expect(res.body.data.map((s: { antennaHeightM: number }) => s.antennaHeightM)).toEqual([5, 12, 30]);
    });

    it('q searches names and access notes case-insensitively; % and _ are literal', async () => {
      const hood = await buildNeighbourhood();
      const agent = await admin();
      const birch = await buildSite({ neighbourhoodId: hood.id, name: 'Birch Flats' });
      const percent = await buildSite({ neighbourhoodId: hood.id, name: '100% Roof' });
      const notes = await buildSite({ neighbourhoodId: hood.id, name: 'Quiet Yard' });
      await notes.update({ accessNotes: 'Ask at the BIRCH cafe for the key' });
      const byName = await agent.get(`/api/v1/sites?neighbourhoodId=${hood.id}&q=birch`);
      expect(byName.body.data.map((s: { id: number }) => s.id).sort()).toEqual([birch.id, notes.id].sort());
      const literal = await agent.get(`/api/v1/sites?neighbourhoodId=${hood.id}&q=${encodeURIComponent('%')}`);
      expect(literal.body.data.map((s: { id: number }) => s.id)).toEqual([percent.id]);
      expect(literal.body.pagination.total).toBe(1);
    });

    it('filters by host', async () => {
      const { host, site } = await hostedSite();
      await buildSite({ neighbourhoodId: site.neighbourhoodId });
      const res = await (await admin()).get(`/api/v1/sites?hostUserId=${host.id}`);
      expect(res.body.data.map((s: { id: number }) => s.id)).toEqual([site.id]);
    });

    it('an operator list holds only their neighbourhood’s sites, whatever the filter asks for', async () => {
      const { hood, agent } = await operatorWithHood();
      const mine = await buildSite({ neighbourhoodId: hood.id });
      const theirs = await buildSite();
      const all = await agent.get('/api/v1/sites');
      expect(all.body.data.map((s: { id: number }) => s.id)).toEqual([mine.id]);
      const asked = await agent.get(`/api/v1/sites?neighbourhoodId=${theirs.neighbourhoodId}`);
      expect(asked.body.data).toEqual([]);
      expect(asked.body.pagination.total).toBe(0);
    });
  });

  describe('host contact details', () => {
    it('shows the host’s e-mail and phone to admins, the neighbourhood’s operators and the host', async () => {
      const { host, site } = await hostedSite();
      const operator = await buildUser({ role: 'operator' });
      await OperatorAssignment.create({ userId: operator.id, neighbourhoodId: site.neighbourhoodId });
      for (const reader of [await buildUser({ role: 'admin' }), operator, host]) {
        const res = await (await signIn(ctx, reader)).get(`/api/v1/sites/${site.id}`);
        expect(res.status).toBe(200);
        expect(res.body.data.host).toEqual({ id: host.id, name: host.name, email: host.email, phone: '+00 555 0101' });
      }
    });

    it('hides them from an operator of another neighbourhood (404, and absent from their list)', async () => {
      const { host, site } = await hostedSite();
      const { agent } = await operatorWithHood();
      expect((await agent.get(`/api/v1/sites/${site.id}`)).status).toBe(404);
      const list = await agent.get('/api/v1/sites?pageSize=500');
      expect(list.text).not.toContain(host.email);
      expect(list.text).not.toContain('555 0101');
    });

    it('hides them from the host of another site', async () => {
      const { host, site } = await hostedSite();
      const neighbour = await buildUser({ role: 'host' });
      const theirSite = await buildSite({ neighbourhoodId: site.neighbourhoodId, hostUserId: neighbour.id });
      const agent = await signIn(ctx, neighbour);
      expect((await agent.get(`/api/v1/sites/${site.id}`)).status).toBe(404);
      const list = await agent.get('/api/v1/sites');
      expect(list.body.data.map((s: { id: number }) => s.id)).toEqual([theirSite.id]);
      expect(list.text).not.toContain(host.email);
    });

    it('lets an operator read a site they host outside their neighbourhoods, with their own contact, but not change it', async () => {
      // Hosting is a relation: this operator hosts a site outside the neighbourhoods they operate.
      const { user: operator, agent } = await operatorWithHood();
      const site = await buildSite({ hostUserId: operator.id });
      const res = await agent.get(`/api/v1/sites/${site.id}`);
      expect(res.status).toBe(200);
      expect(res.body.data.host).toEqual({ id: operator.id, name: operator.name, email: operator.email, phone: null });
      expect(res.body.data.abilities).toEqual({ update: false, delete: false });
    });
  });
});
