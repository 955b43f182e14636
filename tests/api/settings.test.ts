import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { call, useApi } from '../helpers/api';
import { planningCast, setNetwork } from '../helpers/planningActors';

describe('network settings API', () => {
  const ctx = useApi();

  it('answers 401 signed out', async () => {
    expect((await request(ctx.app).get('/api/v1/settings/network')).status).toBe(401);
  });

  it('lets anyone signed in read the settings, with update allowed only for admins', async () => {
    await setNetwork({ region: 'EU', addressPool: '10.64.0.0/16' });
    const { admin, host } = await planningCast(ctx);
    const byHost = await call(host, 'get', '/api/v1/settings/network');
    expect(byHost.status).toBe(200);
    expect(byHost.body.data).toMatchObject({ region: 'EU', addressPool: '10.64.0.0/16', abilities: { update: false } });
    expect((await call(admin, 'get', '/api/v1/settings/network')).body.data.abilities.update).toBe(true);
  });

  it('refuses operators and hosts a change (403)', async () => {
    const { op, host } = await planningCast(ctx);
    for (const who of [op, host]) {
      const res = await call(who, 'patch', '/api/v1/settings/network', { region: 'US' });
      expect(res.status).toBe(403);
      expect(res.body.error.message).toBe('Only admins change the network settings.');
    }
  });

  it.each([
    [{ region: 'AU' }, 'region', 'region must be US, EU or JP'],
    [{ addressPool: '10.64.1.0/16' }, 'addressPool', 'addressPool 10.64.1.0/16 has host bits set; the network is 10.64.0.0/16.'],
    [
      { addressPool: '010.1.0.0/16' },
      'addressPool',
      'addressPool "010.1.0.0" is not an IPv4 address; use four numbers 0–255 without leading zeros, like 10.20.0.0.',
    ],
    [{ timeZone: 'Mars/Olympus' }, 'timeZone', 'timeZone must be an IANA time zone like Europe/Lisbon'],
    [{ colour: 'blue' }, '', 'Unrecognized key: "colour"'],
  ])('refuses %j with a message on the field (400)', async (body, path, message) => {
    const { admin } = await planningCast(ctx);
    const res = await call(admin, 'patch', '/api/v1/settings/network', body);
    expect(res.status).toBe(400);
    expect(res.body.error.details[0]).toEqual({ path, message });
  });

  it('saves an admin change and records it in the change history', async () => {
    await setNetwork({ region: 'EU', addressPool: null });
    const { admin } = await planningCast(ctx);
    const res = await call(admin, 'patch', '/api/v1/settings/network', { region: 'US', addressPool: '10.80.0.0/16' });
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ region: 'US', addressPool: '10.80.0.0/16' });
    const [rows] = await ctx.sequelize.query(
      `SELECT before, after, changed_by FROM change_history WHERE table_name = 'network_settings' ORDER BY id DESC LIMIT 1`,
    );
    const row = (rows as { before: Record<string, unknown>; after: Record<string, unknown>; changed_by: number }[])[0];
    expect(row.before).toMatchObject({ region: 'EU', addressPool: null });
    expect(row.after).toMatchObject({ region: 'US', addressPool: '10.80.0.0/16' });
    expect(row.changed_by).toBe(admin.userId);
  });
});
