import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { OperatorAssignment, User } from '../../server/models';
import { buildUser, call, ids, SIGNED_OUT, signIn, unique, useApi } from '../helpers/api';
import { buildNeighbourhood } from '../helpers/factories';

const ADMINS_ONLY = { code: 'forbidden', message: 'Only admins manage people.' };
const NEW_PASSWORD = 'lantern-harbour-quiet-tide';
const newPerson = (overrides: Record<string, unknown> = {}) => ({
  email: `${unique('ines')}@example.test`,
  name: 'Ines Marlow',
  role: 'host',
  password: NEW_PASSWORD,
  phone: '+00 555 0199',
  ...overrides,
});

describe('users (people) API', () => {
  const ctx = useApi();
  const admin = async () => {
    const user = await buildUser({ role: 'admin' });
    return { user, agent: await signIn(ctx, user) };
  };

  describe('signed out', () => {
    it.each([
      ['lists', 'get', '/api/v1/users'],
      ['reads', 'get', '/api/v1/users/1'],
      ['creates', 'post', '/api/v1/users'],
      ['updates', 'patch', '/api/v1/users/1'],
      ['deletes', 'delete', '/api/v1/users/1'],
    ] as const)('a signed-out caller who %s people gets 401', async (_what, method, url) => {
      const res = await call(request(ctx.app), method, url, method === 'post' || method === 'patch' ? newPerson() : undefined);
      expect(res.status).toBe(401);
      expect(res.body).toEqual({ error: SIGNED_OUT });
    });
  });

  describe('invalid input', () => {
    it.each([
      ['email', 'not-an-address', 'email must be an e-mail address'],
      ['password', 'short-pass', 'password must be at least 12 characters'],
      ['password', undefined, 'password is required'],
      ['role', 'owner', 'role must be one of admin, operator, host'],
      ['name', undefined, 'name is required'],
      ['name', 'Ines\u0007', 'name must not contain control characters or line breaks'],
      ['phone', '5'.repeat(41), 'phone must be at most 40 characters'],
    ])('adding a person with %s = %j answers 400 "%s"', async (field, value, message) => {
      const res = await call((await admin()).agent, 'post', '/api/v1/users', newPerson({ [field]: value }));
      expect(res.status).toBe(400);
      expect(res.body.error).toEqual({ code: 'invalid_input', message: `The request body is invalid: ${message}.`, details: [{ path: field, message }] });
    });

    it('refuses active: "no" on update', async () => {
      const person = await buildUser();
      const res = await call((await admin()).agent, 'patch', `/api/v1/users/${person.id}`, { active: 'no' });
      expect(res.status).toBe(400);
      expect(res.body.error.details.map((d: { path: string }) => d.path)).toEqual(['active']);
    });

    it.each(['get', 'patch', 'delete'] as const)('answers 400 to an admin’s %s with a non-numeric id in the path', async (method) => {
      const res = await call((await admin()).agent, method, '/api/v1/users/me', method === 'patch' ? { name: 'X' } : undefined);
      expect(res.status).toBe(400);
      expect(res.body.error).toEqual({
        code: 'invalid_input',
        message: 'The address is invalid: id must be a number.',
        details: [{ path: 'id', message: 'id must be a number' }],
      });
    });

    it.each([
      ['sort=password', 'Cannot sort by "password". Sort by one of: name, email, role, createdAt, id.'],
      ['pageSize=501', 'The query is invalid: pageSize must be at most 500.'],
      ['role=owner', 'The query is invalid: role must be one of admin, operator, host.'],
    ])('refuses the list query %s with 400', async (query, message) => {
      const res = await (await admin()).agent.get(`/api/v1/users?${query}`);
      expect(res.status).toBe(400);
      expect(res.body.error.message).toBe(message);
    });

    it('will not let an admin demote or deactivate themself', async () => {
      const { user, agent } = await admin();
      for (const body of [{ role: 'operator' }, { active: false }]) {
        const res = await call(agent, 'patch', `/api/v1/users/${user.id}`, body);
        expect(res.status).toBe(400);
        expect(res.body.error).toEqual({ code: 'invalid_input', message: 'You cannot remove your own admin role or deactivate yourself; ask another admin.' });
      }
      expect((await User.findByPk(user.id))!.role).toBe('admin');
    });
  });

  describe('only admins manage people', () => {
    it.each(['operator', 'host'] as const)('a signed-in %s gets 403 for every people action, even a malformed one', async (role) => {
      const me = await buildUser({ role });
      const other = await buildUser();
      const agent = await signIn(ctx, me);
      for (const [method, url, body] of [
        ['get', '/api/v1/users', undefined],
        ['get', `/api/v1/users/${other.id}`, undefined],
        ['get', `/api/v1/users/${me.id}`, undefined],
        ['post', '/api/v1/users', newPerson({ role: 'admin' })],
        ['patch', `/api/v1/users/${me.id}`, { role: 'admin' }],
        ['delete', `/api/v1/users/${other.id}`, undefined],
        ['get', '/api/v1/users/not-a-number', undefined],
      ] as const) {
        const res = await call(agent, method, url, body);
        expect(res.status).toBe(403);
        expect(res.body.error).toEqual(ADMINS_ONLY);
      }
      expect((await User.findByPk(me.id))!.role).toBe(role);
      expect(await User.findByPk(other.id)).not.toBeNull();
    });

    it('will not let an admin remove their own account (403)', async () => {
      const { user, agent } = await admin();
      const res = await call(agent, 'delete', `/api/v1/users/${user.id}`);
      expect(res.status).toBe(403);
      expect(res.body.error).toEqual({ code: 'forbidden', message: 'You cannot remove your own account.' });
    });
  });

  describe('happy paths', () => {
    it('adds a person: 201 with the record, e-mail lower-cased, and no password or hash anywhere', async () => {
      const { agent } = await admin();
      const email = `${unique('Ines')}@Example.TEST`;
      const res = await call(agent, 'post', '/api/v1/users', newPerson({ email }));
      expect(res.status).toBe(201);
      expect(res.body).toEqual({
        data: {
          id: expect.any(Number),
          email: email.toLowerCase(),
          name: 'Ines Marlow',
          role: 'host',
          phone: '+00 555 0199',
          active: true,
          invited: false,
          erased: false,
          neighbourhoodIds: [],
          createdAt: expect.stringMatching(/Z$/),
          abilities: { update: true, delete: true, export: true, erase: true, invite: false },
        },
      });
      expect(res.text).not.toContain(NEW_PASSWORD);
      expect(res.text).not.toMatch(/argon2|passwordHash|password_hash/);
      const signedIn = await request(ctx.app).post('/api/v1/session').send({ email, password: NEW_PASSWORD });
      expect(signedIn.status).toBe(200);
    });

    it('refuses an e-mail address someone already has, whatever the case (409)', async () => {
      const { agent } = await admin();
      const existing = await buildUser();
      const res = await call(agent, 'post', '/api/v1/users', newPerson({ email: existing.email.toUpperCase() }));
      expect(res.status).toBe(409);
      expect(res.body.error).toEqual({ code: 'duplicate', message: 'Someone already has that e-mail address.' });
    });

    it('reads one person with their neighbourhoods; an unknown id is 404', async () => {
      const { agent } = await admin();
      const operator = await buildUser({ role: 'operator' });
      const hood = await buildNeighbourhood({ operators: [operator] });
      const res = await agent.get(`/api/v1/users/${operator.id}`);
      expect(res.status).toBe(200);
      expect(res.body.data).toMatchObject({ id: operator.id, role: 'operator', neighbourhoodIds: [hood.id] });
      const missing = await agent.get('/api/v1/users/987654');
      expect(missing.status).toBe(404);
      expect(missing.body.error).toEqual({ code: 'not_found', message: 'Person 987654 was not found.' });
    });

    it('turning an operator into a host ends their neighbourhood assignments', async () => {
      const { agent } = await admin();
      const operator = await buildUser({ role: 'operator' });
      await buildNeighbourhood({ operators: [operator] });
      const res = await call(agent, 'patch', `/api/v1/users/${operator.id}`, { role: 'host', phone: '+00 555 0123' });
      expect(res.status).toBe(200);
      expect(res.body.data).toMatchObject({ role: 'host', phone: '+00 555 0123', neighbourhoodIds: [] });
      expect(await OperatorAssignment.count({ where: { userId: operator.id } })).toBe(0);
    });

    it('removes a person with 204; their session stops working', async () => {
      const { agent } = await admin();
      const person = await buildUser({ role: 'operator' });
      const theirAgent = await signIn(ctx, person);
      const res = await call(agent, 'delete', `/api/v1/users/${person.id}`);
      expect(res.status).toBe(204);
      expect(await User.findByPk(person.id)).toBeNull();
      expect((await theirAgent.get('/api/v1/sites')).status).toBe(401);
    });
  });

  describe('pagination, sorting, filters and search on the server', () => {
    it('role filter with pageSize=2&sort=-name gives the right two and the total; q searches names and e-mails', async () => {
      const { agent } = await admin();
      const tag = unique('crew');
      const [a, b, c] = [
        await buildUser({ role: 'host', name: `${tag} Ada` }),
        await buildUser({ role: 'host', name: `${tag} Bea` }),
        await buildUser({ role: 'host', name: `${tag} Cy` }),
      ];
      await buildUser({ role: 'operator', name: `${tag} Dee` });
      const page = await agent.get(`/api/v1/users?role=host&q=${tag}&pageSize=2&sort=-name`);
      expect(ids(page.body)).toEqual([c.id, b.id]);
      expect(page.body.pagination).toEqual({ page: 1, pageSize: 2, total: 3 });
      expect(page.body.abilities).toEqual({ create: true });
      const byEmail = await agent.get(`/api/v1/users?q=${encodeURIComponent(a.email.toUpperCase())}`);
      expect(ids(byEmail.body)).toEqual([a.id]);
    });
  });
});
