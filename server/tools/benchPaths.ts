// `npm run bench:paths`: how long paths, cut-offs and root-cause attribution take at 2,000 nodes and
// 3,000 links. Pure figures always; with DATABASE_URL (a database you may write to) also one real
// silence check that attributes a 200-node silence, measured end to end.
import { performance } from 'node:perf_hooks';
import { QueryTypes } from 'sequelize';
import { buildGraph, dependants, type GraphLink, pathsToUplink, reachable } from '../../shared/health/paths';
import { attributeSilence, type WatchedNode } from '../../shared/health/rootCause';

const NODES = Number(process.env.BENCH_NODES ?? 2000);
const LINKS = Number(process.env.BENCH_LINKS ?? 3000);
const SILENT = Number(process.env.BENCH_SILENT ?? 200);
const RUNS = 20;

/**
 * Two uplinks; ten relays on backhaul links to them; behind each relay a neighbourhood of about
 * 200 nodes (a tree plus cross-links inside the neighbourhood) until there are LINKS links.
 */
function network() {
  let seed = 42;
  const rand = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
  const links: GraphLink[] = [];
  const add = (a: number, b: number, live = true) => links.push({ id: links.length + 1, nodeAId: a, nodeBId: b, live, fadeMarginDb: 5 + rand() * 25 });
  const RELAYS = 10;
  for (let r = 3; r < 3 + RELAYS; r++) add(r, r % 2 ? 1 : 2);
  add(1, 2);
  const groupOf = (id: number) => (id - 3 - RELAYS) % RELAYS;
  const members: number[][] = Array.from({ length: RELAYS }, () => []);
  for (let id = 3 + RELAYS; id <= NODES; id++) {
    const g = members[groupOf(id)];
    add(id, g.length ? g[Math.floor(rand() * g.length)] : 3 + groupOf(id));
    g.push(id);
  }
  while (links.length < LINKS) {
    const g = members[Math.floor(rand() * RELAYS)];
    const a = g[Math.floor(rand() * g.length)];
    const b = g[Math.floor(rand() * g.length)];
    if (a !== b) add(a, b, rand() < 0.8);
  }
  return { nodes: Array.from({ length: NODES }, (_, i) => ({ id: i + 1, isUplink: i < 2 })), links };
}

function median(f: () => void) {
  const times: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    const t0 = performance.now();
    f();
    times.push(performance.now() - t0);
  }
  return times.sort((a, b) => a - b)[Math.floor(RUNS / 2)];
}

const net = network();
const graph = buildGraph(net.nodes, net.links);
const paths = pathsToUplink(graph);
const liveReach = reachable(graph, { liveOnly: true });
const topo = { graph, paths, liveReach };
// The silence: the first relay and everything behind it (about SILENT nodes with the defaults).
const root = 3;
const silent = [root, ...dependants(graph, { nodeIds: [root], liveOnly: true })].slice(0, SILENT);
const nowMs = Date.UTC(2026, 0, 1, 12);
const watched = new Map<number, WatchedNode>(
  net.nodes.map((n) => [
    n.id,
    {
      ...n,
      state: 'online',
      reportIntervalS: 60,
      offlineWindowS: 180,
      lastSeenAtMs: nowMs - (silent.includes(n.id) ? 181_000 : 30_000),
    },
  ]),
);

console.log(`network: ${NODES} nodes, ${LINKS} links (${graph.uplinkIds.length} uplinks)`);
console.log(
  `paths to the uplink, all nodes:       ${median(() => pathsToUplink(buildGraph(net.nodes, net.links))).toFixed(2)} ms (graph build + label-setting pass)`,
);
console.log(`what one failure cuts off:            ${median(() => dependants(graph, { nodeIds: [root], liveOnly: true })).toFixed(2)} ms`);
let a = attributeSilence(topo, watched, silent, nowMs, 120);
console.log(
  `attribute a ${silent.length}-node silence (pure):   ${median(() => (a = attributeSilence(topo, watched, silent, nowMs, 120))).toFixed(2)} ms → ${a.roots.length} root(s), ${a.stranded.length} stranded`,
);

if (process.env.DATABASE_URL) await benchDatabase(process.env.DATABASE_URL);

/** One silence check on a real database: the same network, the same 200 nodes silent. */
async function benchDatabase(url: string) {
  const { createSequelize } = await import('../db/sequelize');
  const { initModels } = await import('../models');
  const { runSilenceCheck } = await import('../jobs/silenceCheck');
  const { loadConfig } = await import('../config');
  const config = loadConfig(); // mail settings: the silence check writes the outage mail as it would in production
  const sequelize = createSequelize(url, 4);
  initModels(sequelize);
  const run = Date.now().toString(36);
  const q = (sql: string, bind: unknown[] = []) => sequelize.query(sql, { bind, type: QueryTypes.SELECT });
  const [{ id: hood }] = (await q(`INSERT INTO neighbourhoods (name) VALUES ($1) RETURNING id`, [`Bench paths ${run}`])) as { id: number }[];
  const now = new Date(nowMs + 365 * 86_400_000 * 5);
  const ids = (await q(
    `WITH s AS (INSERT INTO sites (name, neighbourhood_id, latitude, longitude, ground_elevation_m, antenna_height_m)
                SELECT $2 || '-' || g, $1, 47.5 + (g % 50) * 0.002, -38.5 + (g / 50) * 0.002, 10, 8 FROM generate_series(1, $3::int) g RETURNING id, name)
     INSERT INTO nodes (name, site_id, neighbourhood_id, is_uplink, state, state_since, last_seen_at)
     SELECT s.name, s.id, $1, false, 'online', $4, $4 FROM s ORDER BY s.id RETURNING id`,
    [hood, `bench-${run}`, NODES, now],
  )) as { id: number }[];
  const nodeId = (i: number) => ids[i - 1].id;
  await q('UPDATE nodes SET is_uplink = true WHERE id = ANY($1::int[])', [[nodeId(1), nodeId(2)]]);
  await q(
    `INSERT INTO radios (node_id, iface, band, channel, channel_width_mhz, tx_power_dbm, antenna_gain_dbi, role, encryption)
           SELECT id, 'wlan' || k, '5', 36, 20, 18, 23, 'backhaul-ap', 'wpa2-ccmp' FROM unnest($1::int[]) id, generate_series(0, 15) k`,
    [ids.map((x) => x.id)],
  );
  const used = new Map<number, number>();
  const radio = (n: number) => {
    const k = used.get(n) ?? 0;
    used.set(n, k + 1);
    return k;
  };
  const rows = net.links.map((l) => [nodeId(l.nodeAId), radio(l.nodeAId), nodeId(l.nodeBId), radio(l.nodeBId), l.live ? 'live' : 'planned']);
  await q(
    `INSERT INTO links (radio_a_id, radio_b_id, status)
           SELECT ra.id, rb.id, x.status FROM jsonb_to_recordset($1::jsonb) x(a int, ka int, b int, kb int, status text)
             JOIN radios ra ON ra.node_id = x.a AND ra.iface = 'wlan' || x.ka JOIN radios rb ON rb.node_id = x.b AND rb.iface = 'wlan' || x.kb
           WHERE x.ka < 16 AND x.kb < 16 ON CONFLICT DO NOTHING`,
    [JSON.stringify(rows.map(([a, ka, b, kb, status]) => ({ a, ka, b, kb, status })))],
  );
  const checkAt = new Date(now.getTime() + 181_000);
  await q(`UPDATE nodes SET last_seen_at = $2 WHERE neighbourhood_id = $3 AND NOT (id = ANY($1::int[]))`, [
    silent.map(nodeId),
    new Date(checkAt.getTime() - 30_000),
    hood,
  ]);
  await runSilenceCheck(sequelize, config, new Date(now.getTime() - 1000), 1e9); // starts watching; earlier data in this database is judged here
  const { currentTopology } = await import('../services/topologyGraph');
  const tTopo = performance.now();
  await currentTopology(sequelize);
  console.log(`graph and paths from PostgreSQL (inventory changed; predicted margins for every link): ${(performance.now() - tTopo).toFixed(0)} ms`);
  const t0 = performance.now();
  const result = await runSilenceCheck(sequelize, config, checkAt, 1e9);
  const ms = performance.now() - t0;
  const [counts] = (await q(
    `SELECT count(*) FILTER (WHERE state = 'offline')::int AS offline, count(*) FILTER (WHERE state = 'stranded')::int AS stranded FROM nodes WHERE neighbourhood_id = $1`,
    [hood],
  )) as { offline: number; stranded: number }[];
  console.log(
    `silence check on PostgreSQL attributing ${result.silenced} silent nodes (topology cached): ${ms.toFixed(0)} ms → ${counts.offline} offline, ${counts.stranded} stranded`,
  );
  await q('DELETE FROM nodes WHERE neighbourhood_id = $1', [hood]);
  await q('DELETE FROM sites WHERE neighbourhood_id = $1', [hood]);
  await q('DELETE FROM neighbourhoods WHERE id = $1', [hood]);
  await sequelize.close();
}
