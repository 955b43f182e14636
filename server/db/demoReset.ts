// Drops the demo's data so it can be loaded fresh: its people, its neighbourhoods and everything
// in them (sites, nodes, history, mail, photos). Other neighbourhoods, people and settings stay.
import { QueryTypes, type Sequelize } from 'sequelize';
import type { Config } from '../config';
import { photoStore } from '../services/photoStore';
import { NEIGHBOURHOODS, PEOPLE } from './demoScenario';

const ids = async (sequelize: Sequelize, sql: string, bind: unknown[]) =>
  (await sequelize.query<{ id: number }>(sql, { bind, type: QueryTypes.SELECT })).map((r) => r.id);

export async function dropDemo(sequelize: Sequelize, config: Config) {
  const hoods = await ids(sequelize, 'SELECT id FROM neighbourhoods WHERE name = ANY($1::text[])', [NEIGHBOURHOODS.map((n) => n.name)]);
  const users = await ids(sequelize, 'SELECT id FROM users WHERE email = ANY($1::text[])', [PEOPLE.map((p) => p.email)]);
  const sites = await ids(sequelize, 'SELECT id FROM sites WHERE neighbourhood_id = ANY($1::int[])', [hoods]);
  const nodes = await ids(sequelize, 'SELECT id FROM nodes WHERE neighbourhood_id = ANY($1::int[]) OR site_id = ANY($2::int[])', [hoods, sites]);
  const photos = await sequelize.query<{ key: string }>('SELECT storage_key AS key FROM photos WHERE site_id = ANY($1::int[])', {
    bind: [sites],
    type: QueryTypes.SELECT,
  });

  // Raw reports have no foreign key (partitioned): a day that holds only demo reports goes whole, others lose the demo's rows.
  const parts = await sequelize.query<{ name: string }>(
    `SELECT c.relname AS name FROM pg_inherits i JOIN pg_class c ON c.oid = i.inhrelid JOIN pg_class p ON p.oid = i.inhparent
      WHERE p.relname = 'heartbeats'`,
    { type: QueryTypes.SELECT },
  );
  for (const { name } of parts) {
    if (!/^heartbeats_(p\d{8}|default)$/.test(name)) continue;
    const [{ others, mine }] = await sequelize.query<{ others: boolean; mine: boolean }>(
      `SELECT EXISTS (SELECT 1 FROM ${name} WHERE NOT (node_id = ANY($1::int[]))) AS others,
              EXISTS (SELECT 1 FROM ${name} WHERE node_id = ANY($1::int[])) AS mine`,
      { bind: [nodes], type: QueryTypes.SELECT },
    );
    if (!mine) continue; // empty days ahead stay for the storage job
    if (!others && !name.endsWith('_default')) await sequelize.query(`DROP TABLE ${name}`);
    else await sequelize.query(`DELETE FROM ${name} WHERE node_id = ANY($1::int[])`, { bind: [nodes] });
  }

  await sequelize.transaction(async (transaction) => {
    const q = (sql: string, bind: unknown[]) => sequelize.query(sql, { bind, transaction });
    await q('DELETE FROM outbox WHERE node_id = ANY($1::int[]) OR recipient_user_id = ANY($2::int[])', [nodes, users]);
    await q(`DELETE FROM session WHERE (sess->'passport'->>'user')::text = ANY($1::text[])`, [users.map(String)]);
    await q('DELETE FROM nodes WHERE id = ANY($1::int[])', [nodes]); // radios, links, outages, reports' roll-ups and windows go with them
    await q('DELETE FROM sites WHERE id = ANY($1::int[])', [sites]);
    await q('DELETE FROM neighbourhoods WHERE id = ANY($1::int[])', [hoods]);
    await q('DELETE FROM change_history WHERE changed_by = ANY($1::int[])', [users]);
    await q('DELETE FROM users WHERE id = ANY($1::int[])', [users]);
  });
  const store = photoStore(config.dataDir);
  for (const p of photos) await store.remove(p.key);
  return { neighbourhoods: hoods.length, people: users.length, nodes: nodes.length, photos: photos.length };
}
