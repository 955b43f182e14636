import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { describe, expect, it } from 'vitest';
import { Outage, Site, User } from '../../server/models';
import { buildUser, call, PASSWORD, signIn, unique, useApi } from '../helpers/api';
import { buildNeighbourhood, buildNode, buildSite } from '../helpers/factories';

describe('export and erasure of a person’s data', () => {
  const ctx = useApi();
  const admin = async () => signIn(ctx, await buildUser({ role: 'admin' }));

  /** An operator who hosts a site, acknowledged an outage, changed a site and set a phone number. */
  async function scene() {
    const name = unique('Morwenna');
    const digits = String(Math.floor(Math.random() * 1e8)).padStart(8, '0');
    const person = await buildUser({ role: 'operator', name, phone: `+00 ${digits}1` });
    const hood = await buildNeighbourhood({ operators: [person] });
    const site = await buildSite({ neighbourhoodId: hood.id, hostUserId: person.id, name: 'Ropewalk Loft' });
    const node = await buildNode({ siteId: site.id });
    const outage = await Outage.create({
      nodeId: node.id,
      startedAt: new Date('2026-05-01T10:00:00Z'),
      endedAt: new Date('2026-05-01T11:00:00Z'),
      acknowledgedAt: new Date('2026-05-01T10:05:00Z'),
      acknowledgedBy: person.id,
    } as never);
    const agent = await signIn(ctx, person);
    expect((await call(agent, 'patch', `/api/v1/sites/${site.id}`, { accessNotes: 'Key with the harbourmaster' })).status).toBe(200);
    expect((await call(agent, 'patch', '/api/v1/me', { name: `${name}-Hale`, phone: `+00 ${digits}2` })).status).toBe(200);
    return { person, name, digits, hood, site, node, outage, agent };
  }

  describe('who may', () => {
    it.each([
      ['get', 'export'],
      ['post', 'erase'],
    ] as const)('%s /users/:id/%s: 401 signed out, 403 for operators and hosts, 404 for no one, 400 for a bad id', async (method, what) => {
      const person = await buildUser();
      expect((await call(request(ctx.app), method, `/api/v1/users/${person.id}/${what}`)).status).toBe(401);
      for (const role of ['operator', 'host'] as const) {
        const res = await call(await signIn(ctx, await buildUser({ role })), method, `/api/v1/users/${person.id}/${what}`);
        expect(res.status).toBe(403);
        expect(res.body.error.message).toBe('Only admins export or erase a person’s data.');
      }
      const agent = await admin();
      expect((await call(agent, method, `/api/v1/users/999999/${what}`)).status).toBe(404);
      expect((await call(agent, method, `/api/v1/users/abc/${what}`)).status).toBe(400);
    });

    it('an admin cannot erase themself (403)', async () => {
      const me = await buildUser({ role: 'admin' });
      const res = await call(await signIn(ctx, me), 'post', `/api/v1/users/${me.id}/erase`);
      expect(res.status).toBe(403);
      expect(res.body.error.message).toBe('You cannot erase your own account; ask another admin.');
    });
  });

  it('export holds everything about the person, and never the password hash', async () => {
    const { person, name, site, outage } = await scene();
    const res = await (await admin()).get(`/api/v1/users/${person.id}/export`);
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toBe(`attachment; filename="parapet-person-${person.id}.json"`);
    const d = res.body.data;
    expect(d.person).toMatchObject({ id: person.id, email: person.email, name: `${name}-Hale`, phone: expect.stringMatching(/2$/), role: 'operator' });
    expect(d.hostedSites).toEqual([expect.objectContaining({ id: site.id, name: 'Ropewalk Loft', accessNotes: 'Key with the harbourmaster' })]);
    expect(d.operatorOf).toHaveLength(1);
    expect(d.outagesAcknowledged.map((o: { id: number }) => o.id)).toEqual([outage.id]);
    expect(d.changesMade.map((c: { table: string }) => c.table).sort()).toEqual(['sites', 'users']);
    expect(d.changesToTheirAccount.length).toBeGreaterThan(0);
    expect(res.text).not.toMatch(/argon2|passwordHash|password_hash/);
  });

  it('erasure anonymises the person and keeps the network’s records', async () => {
    const { person, name, digits, site, outage, agent } = await scene();
    const adminAgent = await admin();
    const res = await call(adminAgent, 'post', `/api/v1/users/${person.id}/erase`);
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({
      id: person.id,
      name: `Former member #${person.id}`,
      email: `erased-${person.id}@erased.invalid`,
      phone: null,
      active: false,
      erased: true,
    });

    const row = await User.findByPk(person.id);
    expect(row!.passwordHash).toBeNull();
    expect(row!.erasedAt).not.toBeNull();
    // Their session ends, and they cannot sign in with either address.
    expect((await agent.get('/api/v1/me')).status).toBe(401);
    expect((await request(ctx.app).post('/api/v1/session').send({ email: person.email, password: PASSWORD })).status).toBe(401);

    // The site stays, without its host.
    expect((await Site.findByPk(site.id))!.hostUserId).toBeNull();
    // The outage keeps its acknowledgement; the name shown is the anonymised one.
    const o = await call(adminAgent, 'get', `/api/v1/outages/${outage.id}`);
    expect(o.body.data.acknowledgedAt).toBe('2026-05-01T10:05:00.000Z');
    expect(o.body.data.acknowledgedBy).toEqual({ id: person.id, name: `Former member #${person.id}` });
    // The audit trail keeps the change, signed by the anonymised actor.
    const trail = await call(adminAgent, 'get', `/api/v1/history?table=sites&recordId=${site.id}`);
    const byThem = trail.body.data.find((e: { after: Record<string, unknown> | null }) => e.after?.accessNotes === 'Key with the harbourmaster');
    expect(byThem.changedBy).toEqual({ id: person.id, name: `Former member #${person.id}` });
    // No old name, address or phone is left anywhere in the history.
    const leftovers = await ctx.sequelize.query(`SELECT id FROM change_history WHERE concat(before::text, after::text) LIKE ANY($1::text[])`, {
      bind: [[`%${name}%`, `%${person.email}%`, `%${digits}%`]],
      type: QueryTypes.SELECT,
    });
    expect(leftovers).toEqual([]);

    const twice = await call(adminAgent, 'post', `/api/v1/users/${person.id}/erase`);
    expect(twice.status).toBe(409);
    expect(twice.body.error.code).toBe('already_erased');
  });
});
