import { describe, expect, it } from 'vitest';
import { buildUser, call, signIn, useApi } from '../helpers/api';
import { buildNeighbourhood, buildNode, buildOperatorWithHood, buildSite } from '../helpers/factories';

const BIDI = 'must not contain text-direction control characters (U+202A–U+202E, U+2066–U+2069)';

describe('inputs refused before they reach the database', () => {
  const ctx = useApi();

  it.each([
    ['U+202E (right-to-left override)', 'Roof\u202Egnp.exe'],
    ['U+202A (left-to-right embedding)', '\u202ARoof'],
    ['U+2066 (left-to-right isolate)', 'Roof\u2066x'],
    ['U+2069 (pop directional isolate)', 'Roof\u2069'],
  ])('refuses a site name with %s: 400 naming the field', async (_what, name) => {
    const { hood, agent } = await buildOperatorWithHood(ctx);
    const res = await call(agent, 'post', '/api/v1/sites', { name, neighbourhoodId: hood.id, latitude: 47.6, longitude: -38.4 });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([{ path: 'name', message: `name ${BIDI}` }]);
    expect(res.body.error.message).toBe(`The request body is invalid: name ${BIDI}.`);
  });

  it('refuses text-direction characters in node, neighbourhood and person names, and in notes', async () => {
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    const site = await buildSite();
    const node = await buildNode({ siteId: site.id });
    const cases: [string, string, object, string][] = [
      ['post', '/api/v1/nodes', { name: 'node\u202E1', siteId: site.id }, 'name'],
      ['patch', `/api/v1/nodes/${node.id}`, { firmware: 'v1\u2067' }, 'firmware'],
      ['post', '/api/v1/neighbourhoods', { name: 'Quay\u202B' }, 'name'],
      ['post', '/api/v1/neighbourhoods', { name: 'Quay', description: 'by the \u202Eharbour' }, 'description'],
      ['patch', `/api/v1/sites/${site.id}`, { accessNotes: 'ladder in the\u2068 shed' }, 'accessNotes'],
      ['post', '/api/v1/users', { email: 'bidi@example.test', name: 'Ana\u202E', role: 'host', password: 'quartz-lantern-meadow-91' }, 'name'],
      ['patch', '/api/v1/me', { phone: '+00 555\u202E 0101' }, 'phone'],
    ];
    for (const [method, url, body, field] of cases) {
      const res = await call(admin, method as 'post', url, body);
      expect(res.status, `${method} ${url}`).toBe(400);
      expect(res.body.error.details, `${method} ${url}`).toEqual([{ path: field, message: `${field} ${BIDI}` }]);
    }
    // Line breaks stay welcome in notes, and plain names still pass.
    const ok = await call(admin, 'patch', `/api/v1/sites/${site.id}`, { accessNotes: 'Key with the neighbour.\nLadder in the shed.' });
    expect(ok.status).toBe(200);
    expect(ok.body.data.accessNotes).toBe('Key with the neighbour.\nLadder in the shed.');
  });

  it('refuses other control characters in names and one-line fields, naming the field', async () => {
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    const hood = await buildNeighbourhood();
    for (const [name, field, body] of [
      ['bell', 'name', { name: 'Roof\u0007', neighbourhoodId: hood.id, latitude: 1, longitude: 1 }],
      ['C1 control', 'name', { name: 'Roof\u0085x', neighbourhoodId: hood.id, latitude: 1, longitude: 1 }],
      [
        'line break in notes is fine, NUL is not',
        'accessNotes',
        { name: 'Roof', neighbourhoodId: hood.id, latitude: 1, longitude: 1, accessNotes: 'a\nb\u0000' },
      ],
    ] as const) {
      const res = await call(admin, 'post', '/api/v1/sites', body);
      expect(res.status, name).toBe(400);
      expect(
        res.body.error.details.map((d: { path: string }) => d.path),
        name,
      ).toEqual([field]);
    }
  });

  it('refuses month=0000-01 and other years outside 2000–2999 instead of reading them as 1900', async () => {
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    for (const month of ['0000-01', '0099-12', '1999-12']) {
      const res = await call(admin, 'get', `/api/v1/reports/availability?month=${month}`);
      expect(res.status, month).toBe(400);
      expect(res.body.error.details).toEqual([{ path: 'month', message: 'month must be a month between 2000 and 2999, like 2026-11' }]);
    }
    const good = await call(admin, 'get', '/api/v1/reports/availability?month=2026-11');
    expect(good.status).toBe(200);
    expect(good.body.data.from).toMatch(/^2026-1[01]-/);
  });

  it('ends a message built from a whole-sentence detail with one full stop, not two', async () => {
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    const res = await call(op, 'post', '/api/v1/planning/address-plan', { pool: '10.0.0.5/24', prefixLength: 26, count: 1 });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe('The request body is invalid: pool 10.0.0.5/24 has host bits set; the network is 10.0.0.0/24.');
    expect(res.body.error.message.endsWith('..')).toBe(false);
    expect(res.body.error.details).toEqual([{ path: 'pool', message: 'pool 10.0.0.5/24 has host bits set; the network is 10.0.0.0/24.' }]);
  });
});

describe('permission before validation on routes that are not the caller’s at all', () => {
  const ctx = useApi();

  it.each([
    ['post', '/api/v1/planning/link-budget', 'Planning is for operators and admins.'],
    ['post', '/api/v1/planning/regulatory', 'Planning is for operators and admins.'],
    ['post', '/api/v1/planning/address-plan', 'Planning is for operators and admins.'],
    ['post', '/api/v1/planning/planned-links', 'Planning is for operators and admins.'],
    ['post', '/api/v1/planning/channel-plan/apply', 'Planning is for operators and admins.'],
    ['get', '/api/v1/planning/channels?region=XX', 'Planning is for operators and admins.'],
    ['post', '/api/v1/address-plans/allocate', 'Address plans are for operators and admins.'],
    ['patch', '/api/v1/settings/network', 'Only admins change the network settings.'],
    ['post', '/api/v1/outbox/not-a-number/retry', 'Only admins see the outbox: it holds everyone’s mail.'],
    ['get', '/api/v1/outbox?status=nonsense', 'Only admins see the outbox: it holds everyone’s mail.'],
    ['post', '/api/v1/imports/not-a-kind?dryRun=maybe', 'Only admins and operators import sites and nodes.'],
    ['get', '/api/v1/reports/availability?month=0000-01', 'Reports are for admins and operators.'],
    ['post', '/api/v1/users', 'Only admins manage people.'],
    ['delete', '/api/v1/terrain/tiles/not-a-tile', 'Only admins remove terrain tiles.'],
  ])('a host sending nothing useful to %s %s hears 403, not 400', async (method, url, message) => {
    const host = await signIn(ctx, await buildUser({ role: 'host' }));
    const res = await call(host, method as 'post', url, method === 'get' ? undefined : {});
    expect(res.status, JSON.stringify(res.body)).toBe(403);
    expect(res.body.error).toEqual({ code: 'forbidden', message });
  });

  it('still tells an operator what is wrong with the same empty body (400)', async () => {
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    const res = await call(op, 'post', '/api/v1/planning/planned-links', {});
    expect(res.status).toBe(400);
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toEqual(expect.arrayContaining(['a', 'b']));
  });
});
