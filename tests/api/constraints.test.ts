import { describe, expect, it } from 'vitest';
import { createMigrator } from '../../server/db/umzug';
import { MIGRATIONS } from '../../server/migrations';
import { useApi } from '../helpers/api';
import { buildNeighbourhood, buildNode, buildRadio } from '../helpers/factories';

describe('the database guards its own data', () => {
  const ctx = useApi();
  const rejects = (sql: string, bind: unknown[] = []) => expect(ctx.sequelize.query(sql, { bind })).rejects.toThrow();

  it('refuses a latitude outside −90..90 and a longitude outside −180..180', async () => {
    const hood = await buildNeighbourhood();
    await rejects(`INSERT INTO sites (neighbourhood_id, name, latitude, longitude) VALUES ($1, 'Far North', 91, 0)`, [hood.id]);
    await rejects(`INSERT INTO sites (neighbourhood_id, name, latitude, longitude) VALUES ($1, 'Far East', 0, 181)`, [hood.id]);
  });

  it('refuses a channel width outside 20/40/80 and a channel that does not fit the band', async () => {
    const node = await buildNode();
    const base = `INSERT INTO radios (node_id, iface, band, channel, channel_width_mhz, tx_power_dbm, antenna_gain_dbi, role, encryption)
      VALUES ($1, $2, $3, $4, $5, 18, 10, 'mesh', 'wpa2-ccmp')`;
    await rejects(base, [node.id, 'wlan0', '5', 36, 30]);
    await rejects(base, [node.id, 'wlan1', '2.4', 36, 20]);
    await rejects(base, [node.id, 'wlan2', '6', 1, 20]);
  });

  it('refuses duplicate names in one scope, case-insensitively, and a node on a missing site', async () => {
    const hood = await buildNeighbourhood({ name: 'Upper Wharf' });
    await rejects(`INSERT INTO neighbourhoods (name) VALUES ('upper wharf')`);
    await rejects(`INSERT INTO nodes (site_id, neighbourhood_id, name) VALUES (999999, $1, 'orphan')`, [hood.id]);
  });

  it('refuses a link from a radio to itself and the same pair twice in either order', async () => {
    const a = await buildRadio();
    const b = await buildRadio();
    await rejects(`INSERT INTO links (radio_a_id, radio_b_id) VALUES ($1, $1)`, [a.id]);
    await ctx.sequelize.query(`INSERT INTO links (radio_a_id, radio_b_id) VALUES ($1, $2)`, { bind: [a.id, b.id] });
    await rejects(`INSERT INTO links (radio_a_id, radio_b_id) VALUES ($1, $2)`, [b.id, a.id]);
  });

  it('refuses a second open outage for one node', async () => {
    const node = await buildNode();
    await ctx.sequelize.query(`INSERT INTO outages (node_id, started_at) VALUES ($1, now())`, { bind: [node.id] });
    await rejects(`INSERT INTO outages (node_id, started_at) VALUES ($1, now())`, [node.id]);
  });

  it('lists every migration once, in order, and all of them are applied', async () => {
    const names = MIGRATIONS.map((m) => m.name);
    expect([...names].sort()).toEqual(names);
    const executed = (await createMigrator(ctx.sequelize).executed()).map((m) => m.name);
    expect(executed).toEqual(names);
  });
});
