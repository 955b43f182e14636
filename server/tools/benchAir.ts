// `npm run bench:air`: how long the air view (observed, silent and discovered links) takes to read
// a day of reports. Needs DATABASE_URL of a database you may write to: it adds BENCH_AIR_NODES nodes
// in pairs, each with one backhaul radio reporting its own and its peer's MAC every 60 s for a day
// (half the pairs have an inventory link, half are "discovered"), times the view, and removes
// everything it added.
import { performance } from 'node:perf_hooks';
import { QueryTypes } from 'sequelize';
import { createSequelize } from '../db/sequelize';
import { airView } from '../services/airObservations';

const NODES = Number(process.env.BENCH_AIR_NODES ?? 200);
const RUNS = 10;
const url = process.env.DATABASE_URL;
if (!url) throw new Error('DATABASE_URL must point at a database you may write to.');
const sequelize = createSequelize(url, 2);
const tag = `bench-air-${Date.now()}`;
const q = <T extends object>(sql: string, bind: unknown[] = []) => sequelize.query<T>(sql, { bind, type: QueryTypes.SELECT });

const now = new Date();
let hoodId = 0;
try {
  [{ id: hoodId }] = await q<{ id: number }>('INSERT INTO neighbourhoods (name) VALUES ($1) RETURNING id', [tag]);
  const [{ id: siteId }] = await q<{ id: number }>(
    'INSERT INTO sites (neighbourhood_id, name, latitude, longitude) VALUES ($1, $2, 47.6, -38.4) RETURNING id',
    [hoodId, tag],
  );
  const nodes = await q<{ id: number; n: number }>(
    `INSERT INTO nodes (site_id, neighbourhood_id, name) SELECT $1, $2, $3 || '-' || g FROM generate_series(1, $4) g RETURNING id, (regexp_replace(name, '.*-', ''))::int AS n`,
    [siteId, hoodId, tag, NODES],
  );
  const mac = (n: number) => `02:be:00:${((n >> 8) & 255).toString(16).padStart(2, '0')}:${(n & 255).toString(16).padStart(2, '0')}:01`;
  const radios = new Map<number, number>();
  for (const node of nodes) {
    const [{ id }] = await q<{ id: number }>(
      `INSERT INTO radios (node_id, iface, band, channel, channel_width_mhz, tx_power_dbm, antenna_gain_dbi, role, encryption, mac)
       VALUES ($1, 'wlan0', '5', 36, 20, 18, 23, 'backhaul-ap', 'wpa2-ccmp', $2) RETURNING id`,
      [node.id, mac(node.n)],
    );
    radios.set(node.n, id);
  }
  // Pairs (1,2), (3,4), …: the odd ones are in the inventory, the even ones only on the air.
  for (let n = 1; n + 1 <= NODES; n += 2) {
    if ((n + 1) % 4 === 2)
      await sequelize.query(`INSERT INTO links (radio_a_id, radio_b_id, status) VALUES ($1, $2, 'live')`, { bind: [radios.get(n), radios.get(n + 1)] });
  }
  const t0 = performance.now();
  await sequelize.query(
    `INSERT INTO heartbeats (node_id, seq, received_at, radios)
     SELECT nd.id, s.i, $2::timestamptz - s.i * interval '60 seconds', jsonb_build_array(jsonb_build_object('iface', 'wlan0', 'signalDbm', -60,
            'peerMac', '02:be:00:' || lpad(to_hex((p.n >> 8) & 255), 2, '0') || ':' || lpad(to_hex(p.n & 255), 2, '0') || ':01'))
       FROM (SELECT id, (regexp_replace(name, '.*-', ''))::int AS n FROM nodes WHERE neighbourhood_id = $1) nd
       CROSS JOIN LATERAL (SELECT CASE WHEN nd.n % 2 = 1 THEN nd.n + 1 ELSE nd.n - 1 END AS n) p
       CROSS JOIN generate_series(0, 1439) s(i)`,
    { bind: [hoodId, now] },
  );
  const rows = NODES * 1440;
  console.log(`air bench: ${NODES} nodes, ${rows.toLocaleString('en')} radio rows over a day (written in ${((performance.now() - t0) / 1000).toFixed(1)} s)`);
  const times: number[] = [];
  let result: Awaited<ReturnType<typeof airView>> | null = null;
  for (let i = 0; i < RUNS; i++) {
    const t = performance.now();
    result = await airView(
      sequelize,
      now,
      { observedWindowS: 900, silentAfterS: 86_400 },
      nodes.map((n) => n.id),
    );
    times.push(performance.now() - t);
  }
  times.sort((a, b) => a - b);
  const observed = [...result!.byLink.values()].filter((l) => l.observed).length;
  console.log(
    `air view: p50 ${times[Math.floor(RUNS / 2)].toFixed(0)} ms, max ${times[RUNS - 1].toFixed(0)} ms over ${RUNS} runs; ${observed} links observed, ${result!.discoveredLinks.length} pairs discovered`,
  );
} finally {
  if (hoodId) {
    await sequelize.query('DELETE FROM heartbeats WHERE node_id IN (SELECT id FROM nodes WHERE neighbourhood_id = $1)', { bind: [hoodId] });
    await sequelize.query('DELETE FROM links WHERE radio_a_id IN (SELECT r.id FROM radios r JOIN nodes n ON n.id = r.node_id WHERE n.neighbourhood_id = $1)', {
      bind: [hoodId],
    });
    await sequelize.query('DELETE FROM radios WHERE node_id IN (SELECT id FROM nodes WHERE neighbourhood_id = $1)', { bind: [hoodId] });
    await sequelize.query('DELETE FROM nodes WHERE neighbourhood_id = $1', { bind: [hoodId] });
    await sequelize.query('DELETE FROM sites WHERE neighbourhood_id = $1', { bind: [hoodId] });
    await sequelize.query('DELETE FROM neighbourhoods WHERE id = $1', { bind: [hoodId] });
  }
  await sequelize.close();
}
