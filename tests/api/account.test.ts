import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { buildUser, call, PASSWORD, signIn, useApi } from '../helpers/api';
import { buildNeighbourhood, buildSite } from '../helpers/factories';

const NEW = 'gannet-orchard-brass-window';

describe('own account, role changes and deactivation', () => {
  const ctx = useApi();
  const signInAgain = (email: string, password: string) => request(ctx.app).post('/api/v1/session').send({ email, password });

  describe('signed out', () => {
    it.each([
      ['get', '/api/v1/me'],
      ['patch', '/api/v1/me'],
      ['post', '/api/v1/me/password'],
      ['get', '/api/v1/me/nodes'],
    ] as const)('%s %s answers 401', async (method, url) => {
      const res = await call(request(ctx.app), method, url, method === 'get' ? undefined : {});
      expect(res.status).toBe(401);
    });
  });

  it('every role reads and changes its own name and phone, not its role', async () => {
    for (const role of ['admin', 'operator', 'host'] as const) {
      const user = await buildUser({ role, phone: '+00 555 0100' });
      const agent = await signIn(ctx, user);
      expect((await agent.get('/api/v1/me')).body.data).toEqual({ id: user.id, email: user.email, name: user.name, role, phone: '+00 555 0100' });
      const res = await call(agent, 'patch', '/api/v1/me', { name: 'Hester Quill', phone: null, role: 'admin' });
      expect(res.status).toBe(200);
      expect(res.body.data).toEqual({ id: user.id, email: user.email, name: 'Hester Quill', role, phone: null });
    }
  });

  it('answers 400 to an empty or bad contact update', async () => {
    const agent = await signIn(ctx, await buildUser());
    const empty = await call(agent, 'patch', '/api/v1/me', {});
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toBe('The request body is invalid: give a name or a phone number to change.');
    const long = await call(agent, 'patch', '/api/v1/me', { phone: '5'.repeat(41) });
    expect(long.body.error.details).toEqual([{ path: 'phone', message: 'phone must be at most 40 characters' }]);
  });

  describe('changing one’s own password', () => {
    it('needs the current password (400 otherwise) and a strong new one', async () => {
      const user = await buildUser();
      const agent = await signIn(ctx, user);
      const wrong = await call(agent, 'post', '/api/v1/me/password', { currentPassword: 'not-my-password', newPassword: NEW });
      expect(wrong.status).toBe(400);
      expect(wrong.body.error.details).toEqual([{ path: 'currentPassword', message: 'currentPassword does not match your current password' }]);
      const weak = await call(agent, 'post', '/api/v1/me/password', { currentPassword: PASSWORD, newPassword: 'letmein' });
      expect(weak.status).toBe(400);
      expect(weak.body.error.details).toEqual([{ path: 'newPassword', message: 'newPassword must be at least 12 characters' }]);
      const same = await call(agent, 'post', '/api/v1/me/password', { currentPassword: PASSWORD, newPassword: PASSWORD });
      expect(same.status).toBe(400);
      expect(same.body.error.details[0].path).toBe('newPassword');
    });

    it('changes it, keeps this session, and signs out the person’s other sessions', async () => {
      const user = await buildUser();
      const here = await signIn(ctx, user);
      const elsewhere = await signIn(ctx, user);
      const res = await call(here, 'post', '/api/v1/me/password', { currentPassword: PASSWORD, newPassword: NEW });
      expect(res.status).toBe(204);
      expect((await here.get('/api/v1/me')).status).toBe(200);
      expect((await elsewhere.get('/api/v1/me')).status).toBe(401);
      expect((await signInAgain(user.email, PASSWORD)).status).toBe(401);
      expect((await signInAgain(user.email, NEW)).status).toBe(200);
    });
  });

  it('deactivating a person ends their session at once, and reactivating lets them sign in again', async () => {
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    const person = await buildUser({ role: 'operator' });
    const theirs = await signIn(ctx, person);
    expect((await theirs.get('/api/v1/me')).status).toBe(200);
    expect((await call(admin, 'patch', `/api/v1/users/${person.id}`, { active: false })).status).toBe(200);
    const after = await theirs.get('/api/v1/me');
    expect(after.status).toBe(401);
    expect((await theirs.get('/api/v1/session')).body.user).toBeNull();
    expect((await signInAgain(person.email, PASSWORD)).status).toBe(401);
    expect((await call(admin, 'patch', `/api/v1/users/${person.id}`, { active: true })).status).toBe(200);
    expect((await signInAgain(person.email, PASSWORD)).status).toBe(200);
  });

  it('a role change takes effect on the person’s very next request', async () => {
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    const person = await buildUser({ role: 'admin' });
    const theirs = await signIn(ctx, person);
    expect((await theirs.get('/api/v1/users')).status).toBe(200);
    const res = await call(admin, 'patch', `/api/v1/users/${person.id}`, { role: 'host' });
    expect(res.status).toBe(200);
    expect(res.body.data.role).toBe('host');
    expect((await theirs.get('/api/v1/users')).status).toBe(403);
    expect((await theirs.get('/api/v1/session')).body.user.role).toBe('host');
  });

  describe('host portal (/me/nodes)', () => {
    it('lists only the sites the caller hosts, with a plain sentence per node', async () => {
      const host = await buildUser({ role: 'host' });
      const hood = await buildNeighbourhood();
      const mine = await buildSite({ neighbourhoodId: hood.id, hostUserId: host.id, name: 'Quay Chandlery' });
      await buildSite({ neighbourhoodId: hood.id, name: 'Someone else’s roof' });
      const { Node } = await import('../../server/models');
      await Node.create({ name: 'qc-1', siteId: mine.id, neighbourhoodId: hood.id, state: 'online' });
      const res = await (await signIn(ctx, host)).get('/api/v1/me/nodes');
      expect(res.status).toBe(200);
      expect(res.body.data).toHaveLength(1);
      expect(res.body.data[0]).toMatchObject({ id: mine.id, name: 'Quay Chandlery', neighbourhoodName: hood.name });
      expect(res.body.data[0].nodes).toEqual([
        expect.objectContaining({
          name: 'qc-1',
          state: 'online',
          summary: 'Your node on Quay Chandlery is working normally.',
          recentOutages: [],
          availability: { h24Pct: null, d30Pct: null },
        }),
      ]);
    });

    it('carries each node’s maintenance windows exactly as the node’s own maintenance list answers them', async () => {
      const host = await buildUser({ role: 'host' });
      const hood = await buildNeighbourhood();
      const site = await buildSite({ neighbourhoodId: hood.id, hostUserId: host.id });
      const { Node } = await import('../../server/models');
      const node = await Node.create({ name: 'qc-2', siteId: site.id, neighbourhoodId: hood.id, state: 'online' });
      const agent = await signIn(ctx, host);
      const startsAt = new Date(Date.now() + 86_400_000).toISOString();
      const endsAt = new Date(Date.now() + 90_000_000).toISOString();
      const announced = await call(agent, 'post', `/api/v1/nodes/${node.id}/maintenance-windows`, { startsAt, endsAt, reason: 'New roof felt' });
      expect(announced.status).toBe(201);

      const res = await agent.get('/api/v1/me/nodes');
      expect(res.status).toBe(200);
      const carried = res.body.data[0].nodes[0].maintenance;
      expect(carried).toEqual((await agent.get(`/api/v1/nodes/${node.id}/maintenance-windows`)).body);
      expect(carried).toEqual({
        data: [expect.objectContaining({ id: announced.body.data.id, status: 'upcoming', reason: 'New roof felt', abilities: { cancel: true } })],
        abilities: { create: true },
      });
    });

    it('is empty for someone who hosts nothing', async () => {
      const res = await (await signIn(ctx, await buildUser({ role: 'operator' }))).get('/api/v1/me/nodes');
      expect(res.body.data).toEqual([]);
    });
  });
});
