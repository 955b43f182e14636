import { describe, expect, it } from 'vitest';
import { OutboxMessage, Site, User } from '../../server/models';
import { buildUser, call, signIn, useApi } from '../helpers/api';
import { buildNeighbourhood, buildOperatorWithHood, buildSite } from '../helpers/factories';

const REFUSED = {
  code: 'invalid_input',
  message: 'Choose the host among the people who already host a site in your neighbourhoods, or invite the new host by e-mail.',
  details: [{ path: 'hostUserId', message: 'hostUserId must be you or someone who already hosts a site in your neighbourhoods' }],
};

describe('who an operator may make a site’s host', () => {
  const ctx = useApi();

  /** An operator's neighbourhood with one of their sites, a neighbour who hosts there, and people elsewhere. */
  async function scene() {
    const { user: operator, hood, agent } = await buildOperatorWithHood(ctx);
    const site = await buildSite({ neighbourhoodId: hood.id });
    const neighbour = await buildUser({ role: 'host', phone: '+00 555 0111' });
    await buildSite({ neighbourhoodId: hood.id, hostUserId: neighbour.id });
    const admin = await buildUser({ role: 'admin', phone: '+00 555 0122' });
    const otherOperator = await buildUser({ role: 'operator', phone: '+00 555 0133' });
    const otherHood = await buildNeighbourhood({ operators: [otherOperator] });
    const farHost = await buildUser({ role: 'host', phone: '+00 555 0144' });
    await buildSite({ neighbourhoodId: otherHood.id, hostUserId: farHost.id });
    const inactive = await buildUser({ role: 'host', active: false });
    return { operator, hood, agent, site, neighbour, admin, otherOperator, farHost, inactive };
  }

  it('gives the same 400 for anyone else — admin, other operators, far hosts, inactive or missing ids — and leaks no contact', async () => {
    const s = await scene();
    for (const person of [s.admin, s.otherOperator, s.farHost, s.inactive, { id: 987654, email: 'none', phone: 'none' }]) {
      const res = await call(s.agent, 'patch', `/api/v1/sites/${s.site.id}`, { hostUserId: person.id });
      expect(res.status, `person ${person.id}`).toBe(400);
      expect(res.body.error).toEqual(REFUSED);
      expect(res.text).not.toContain(person.email);
      if (person.phone) expect(res.text).not.toContain(person.phone);
      // Creating a site names the host the same way.
      const created = await call(s.agent, 'post', '/api/v1/sites', {
        name: `New ${person.id}`,
        neighbourhoodId: s.hood.id,
        latitude: 47.6,
        longitude: -38.4,
        hostUserId: person.id,
      });
      expect(created.status).toBe(400);
      expect(created.body.error).toEqual(REFUSED);
    }
    expect((await Site.findByPk(s.site.id))!.hostUserId).toBeNull();
  });

  it('accepts someone who already hosts in the neighbourhood, and the operator themself', async () => {
    const s = await scene();
    const res = await call(s.agent, 'patch', `/api/v1/sites/${s.site.id}`, { hostUserId: s.neighbour.id });
    expect(res.status).toBe(200);
    expect(res.body.data.host).toEqual({ id: s.neighbour.id, name: s.neighbour.name, email: s.neighbour.email, phone: '+00 555 0111' });
    const self = await call(s.agent, 'patch', `/api/v1/sites/${s.site.id}`, { hostUserId: s.operator.id });
    expect(self.status).toBe(200);
    expect(self.body.data.hostUserId).toBe(s.operator.id);
  });

  it('lets an operator keep a host an admin chose, while editing other fields', async () => {
    const s = await scene();
    await Site.update({ hostUserId: s.farHost.id }, { where: { id: s.site.id } });
    const res = await call(s.agent, 'patch', `/api/v1/sites/${s.site.id}`, { hostUserId: s.farHost.id, accessNotes: 'Ladder in the shed.' });
    expect(res.status).toBe(200);
    expect(res.body.data.accessNotes).toBe('Ladder in the shed.');
  });

  it('lists the people the caller may pick, by name and id only', async () => {
    const s = await scene();
    const res = await call(s.agent, 'get', '/api/v1/sites/host-candidates');
    expect(res.status).toBe(200);
    const expected = [s.operator, s.neighbour].sort((a, b) => a.name.localeCompare(b.name)).map((u) => ({ id: u.id, name: u.name }));
    expect(res.body.data).toEqual(expected);
    const admin = await signIn(ctx, s.admin);
    const all = await call(admin, 'get', '/api/v1/sites/host-candidates');
    expect(all.body.data.map((u: { id: number }) => u.id)).toEqual(expect.arrayContaining([s.operator.id, s.neighbour.id, s.farHost.id, s.otherOperator.id]));
    expect(all.body.data.map((u: { id: number }) => u.id)).not.toContain(s.inactive.id);
    const host = await signIn(ctx, s.neighbour);
    expect((await call(host, 'get', '/api/v1/sites/host-candidates')).status).toBe(403);
  });
});

describe('an operator inviting a new host by e-mail', () => {
  const ctx = useApi();
  const invitee = { email: 'tamsin.corrie@lindenfall.example', name: 'Tamsin Corrie', role: 'host' };

  it('invites the host of one of their sites: the person is created, becomes the host and gets the mail', async () => {
    const { hood, agent } = await buildOperatorWithHood(ctx);
    const site = await buildSite({ neighbourhoodId: hood.id });
    const res = await call(agent, 'post', '/api/v1/invitations', { ...invitee, siteId: site.id });
    expect(res.status).toBe(201);
    const person = (await User.findOne({ where: { email: invitee.email } }))!;
    expect(person.active).toBe(false);
    expect(person.role).toBe('host');
    expect((await Site.findByPk(site.id))!.hostUserId).toBe(person.id);
    expect(await OutboxMessage.count({ where: { kind: 'invitation', recipientAddress: invitee.email } })).toBe(1);
  });

  it('refuses other roles, a missing site, a site elsewhere and an address that already has an account', async () => {
    const { hood, agent } = await buildOperatorWithHood(ctx);
    const site = await buildSite({ neighbourhoodId: hood.id });
    const elsewhere = await buildSite();
    const asOperator = await call(agent, 'post', '/api/v1/invitations', { ...invitee, email: 'x1@lindenfall.example', role: 'operator', siteId: site.id });
    expect(asOperator.status).toBe(400);
    expect(asOperator.body.error.details).toEqual([{ path: 'role', message: 'role must be host' }]);
    const noSite = await call(agent, 'post', '/api/v1/invitations', { ...invitee, email: 'x2@lindenfall.example' });
    expect(noSite.status).toBe(400);
    expect(noSite.body.error.details).toEqual([{ path: 'siteId', message: 'siteId is required' }]);
    expect((await call(agent, 'post', '/api/v1/invitations', { ...invitee, email: 'x3@lindenfall.example', siteId: elsewhere.id })).status).toBe(404);
    const existing = await buildUser({ role: 'operator' });
    const taken = await call(agent, 'post', '/api/v1/invitations', { ...invitee, email: existing.email, siteId: site.id });
    expect(taken.status).toBe(409);
    expect(taken.text).not.toContain(existing.name);
    expect((await Site.findByPk(site.id))!.hostUserId).toBeNull();
    expect(await User.count({ where: { email: ['x1@lindenfall.example', 'x2@lindenfall.example', 'x3@lindenfall.example'] } })).toBe(0);
  });

  it('does not let an operator rewrite someone else’s pending invitation', async () => {
    const { hood, agent } = await buildOperatorWithHood(ctx);
    const site = await buildSite({ neighbourhoodId: hood.id });
    const pending = await User.create({ email: 'pending.admin@lindenfall.example', name: 'Pending Admin', role: 'admin', active: false, passwordHash: null });
    const res = await call(agent, 'post', '/api/v1/invitations', { ...invitee, email: pending.email, siteId: site.id });
    expect(res.status).toBe(409);
    expect((await User.findByPk(pending.id))!.role).toBe('admin');
  });
});
