import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { Node } from '../../server/models';
import { buildUser, call, signIn, unique, useApi, type Agent } from '../helpers/api';
import { buildLink, buildNeighbourhood, buildNode, buildRadio, buildSite } from '../helpers/factories';

interface Entry {
  table: string;
  recordId: string;
  action: string;
  changedBy: { id: number; name: string } | null;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
}

describe('audit trail (change history)', () => {
  const ctx = useApi();
  const trail = async (agent: Agent, table: string, id: number): Promise<Entry[]> => {
    const res = await agent.get(`/api/v1/history?table=${table}&recordId=${id}`);
    expect(res.status).toBe(200);
    return res.body.data;
  };
  const admin = async () => {
    const user = await buildUser({ role: 'admin', name: unique('Admin') });
    return { user, agent: await signIn(ctx, user) };
  };

  it('records creates, updates and deletes of sites, nodes and neighbourhoods with who and only the changed fields', async () => {
    const { user, agent } = await admin();
    const hood = await call(agent, 'post', '/api/v1/neighbourhoods', { name: unique('Tannery Row') });
    expect(hood.status).toBe(201);
    const hoodId = hood.body.data.id;
    await call(agent, 'patch', `/api/v1/neighbourhoods/${hoodId}`, { description: 'Old tannery yards' });
    const site = await call(agent, 'post', '/api/v1/sites', { name: unique('Dye Works'), neighbourhoodId: hoodId, latitude: 47.61, longitude: -38.41 });
    expect(site.status).toBe(201);
    await call(agent, 'patch', `/api/v1/sites/${site.body.data.id}`, { antennaHeightM: 12 });
    const node = await call(agent, 'post', '/api/v1/nodes', { name: unique('dw'), siteId: site.body.data.id });
    expect(node.status).toBe(201);
    await call(agent, 'patch', `/api/v1/nodes/${node.body.data.id}`, { firmware: 'v2.1' });
    expect((await call(agent, 'delete', `/api/v1/nodes/${node.body.data.id}`)).status).toBe(204);

    const hoodTrail = await trail(agent, 'neighbourhoods', hoodId);
    expect(hoodTrail.map((e) => e.action)).toEqual(['update', 'create']);
    expect(hoodTrail[0]).toMatchObject({
      changedBy: { id: user.id, name: user.name },
      before: { description: null },
      after: { description: 'Old tannery yards' },
    });
    const siteTrail = await trail(agent, 'sites', site.body.data.id);
    expect(siteTrail[0]).toMatchObject({ action: 'update', before: { antennaHeightM: 0 }, after: { antennaHeightM: 12 } });
    expect(Object.keys(siteTrail[0].after!)).toEqual(['antennaHeightM']);
    const nodeTrail = await trail(agent, 'nodes', node.body.data.id);
    expect(nodeTrail.map((e) => e.action)).toEqual(['delete', 'update', 'create']);
    expect(nodeTrail[1]).toMatchObject({ before: { firmware: null }, after: { firmware: 'v2.1' } });
    expect(nodeTrail[0].after).toBeNull();
  });

  it('records radio and link changes and masks pre-shared keys', async () => {
    const { agent } = await admin();
    const link = await buildLink();
    const radio = await buildRadio();
    await call(agent, 'patch', `/api/v1/radios/${radio.id}`, { preSharedKey: 'a-brand-new-secret-key', channel: 44 });
    await call(agent, 'patch', `/api/v1/links/${link.id}`, { status: 'live' });
    expect((await call(agent, 'delete', `/api/v1/links/${link.id}`)).status).toBe(204);

    const [radioChange] = await trail(agent, 'radios', radio.id);
    expect(radioChange).toMatchObject({ before: { channel: 36, preSharedKey: '(hidden)' }, after: { channel: 44, preSharedKey: '(hidden)' } });
    const linkTrail = await trail(agent, 'links', link.id);
    expect(linkTrail.map((e) => e.action)).toEqual(['delete', 'update']);
    expect(linkTrail[1]).toMatchObject({ before: { status: 'planned' }, after: { status: 'live' } });
    const everything = await agent.get('/api/v1/history?pageSize=500');
    expect(everything.text).not.toContain('a-brand-new-secret-key');
    expect(everything.text).not.toContain('a-long-enough-test-key');
  });

  it('records people’s changes with the password hash masked, and operator assignments', async () => {
    const { agent } = await admin();
    const created = await call(agent, 'post', '/api/v1/users', {
      email: `${unique('ula')}@example.test`,
      name: 'Ula Penhaligon',
      role: 'operator',
      password: 'moorland-cobble-lantern-fig',
    });
    const id = created.body.data.id;
    await call(agent, 'patch', `/api/v1/users/${id}`, { role: 'host' });
    const people = await trail(agent, 'users', id);
    expect(people[0]).toMatchObject({ action: 'update', before: { role: 'operator' }, after: { role: 'host' } });
    expect(people[1].after).toMatchObject({ name: 'Ula Penhaligon', passwordHash: '(hidden)' });
    expect(JSON.stringify(people)).not.toMatch(/argon2/);

    const operator = await buildUser({ role: 'operator' });
    const hood = await buildNeighbourhood();
    await call(agent, 'put', `/api/v1/neighbourhoods/${hood.id}/operators`, { userIds: [operator.id] });
    const [assigned] = await trail(agent, 'neighbourhoods', hood.id);
    expect(assigned).toMatchObject({ before: { operatorIds: [] }, after: { operatorIds: [operator.id] } });
  });

  it('leaves health-state writes outside requests (heartbeats, the silence check) out of the trail', async () => {
    const { agent } = await admin();
    const node = await buildNode();
    await Node.update({ state: 'offline', lastSeenAt: new Date() }, { where: { id: node.id } });
    await node.update({ state: 'online' });
    expect(await trail(agent, 'nodes', node.id)).toEqual([]);
  });

  describe('who may read it', () => {
    it('answers 401 signed out', async () => {
      expect((await request(ctx.app).get('/api/v1/history')).status).toBe(401);
    });

    it('answers 400 to an unknown table', async () => {
      const res = await (await admin()).agent.get('/api/v1/history?table=passwords&recordId=1');
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([{ path: 'table', message: 'table must be one of sites, nodes, radios, links, neighbourhoods, users' }]);
    });

    it('the whole trail is for admins only (403 for others)', async () => {
      for (const role of ['operator', 'host'] as const) {
        const res = await (await signIn(ctx, await buildUser({ role }))).get('/api/v1/history');
        expect(res.status).toBe(403);
        expect(res.body.error.message).toBe('Only admins read the whole change history. Give table and recordId for one record’s history.');
      }
    });

    it('an operator reads the history of records in their neighbourhoods, a host of the sites they host, and no one else’s (404)', async () => {
      const operator = await buildUser({ role: 'operator' });
      const host = await buildUser({ role: 'host' });
      const mine = await buildNeighbourhood({ operators: [operator] });
      const other = await buildNeighbourhood();
      const hosted = await buildSite({ neighbourhoodId: other.id, hostUserId: host.id });
      const opAgent = await signIn(ctx, operator);
      const hostAgent = await signIn(ctx, host);
      expect((await opAgent.get(`/api/v1/history?table=neighbourhoods&recordId=${mine.id}`)).status).toBe(200);
      expect((await opAgent.get(`/api/v1/history?table=neighbourhoods&recordId=${other.id}`)).status).toBe(404);
      expect((await opAgent.get(`/api/v1/history?table=sites&recordId=${hosted.id}`)).status).toBe(404);
      expect((await opAgent.get(`/api/v1/history?table=users&recordId=${operator.id}`)).status).toBe(200);
      expect((await opAgent.get(`/api/v1/history?table=users&recordId=${host.id}`)).status).toBe(404);
      expect((await hostAgent.get(`/api/v1/history?table=sites&recordId=${hosted.id}`)).status).toBe(200);
      expect((await hostAgent.get(`/api/v1/history?table=links&recordId=1`)).status).toBe(404);
    });
  });
});
