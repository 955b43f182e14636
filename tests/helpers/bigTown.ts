// A big invented town for map tests: thousands of nodes written with a few multi-row inserts.
import { createAdapter } from '@socket.io/postgres-adapter';
import pg from 'pg';
import { Server } from 'socket.io';
import { NODE_STATES, type NodeState } from '../../shared/enums';
import type { NodeStateEvent } from '../../shared/schemas/realtime';

/** Invented quarters of greater Lindenfall; none is a real place. */
export const BIG_TOWN_QUARTERS = [
  'Kelpwick Reach',
  'Tarrow Quay',
  'Brinefold',
  'Gullstone Heights',
  'Mastwright Lane',
  'Ropewalk End',
  'Lanternhill',
  'Shoalmere',
  'Ferrygate',
  'Driftholm',
  'Capstan Rise',
  'Oysterbank',
];
const NODE_PREFIX = 'bigtown-';
const CENTRE = { latitude: 47.6012, longitude: -38.4127 };

export interface BigTownNode {
  id: number;
  name: string;
  neighbourhoodId: number;
  state: NodeState;
}

export interface BigTown {
  neighbourhoods: { id: number; name: string }[];
  nodes: BigTownNode[];
  linkCount: number;
}

/** A small deterministic generator (a linear congruential one), so every run draws the same town. */
function lcg(seed: number) {
  let x = seed >>> 0;
  return () => {
    x = (Math.imul(x, 1664525) + 1013904223) >>> 0;
    return x / 2 ** 32;
  };
}

const STATE_MIX: [NodeState, number][] = [
  ['online', 0.8],
  ['degraded', 0.08],
  ['offline', 0.06],
  ['maintenance', 0.03],
  ['unknown', 0.03],
];
function pickState(r: number): NodeState {
  let sum = 0;
  for (const [state, share] of STATE_MIX) if ((sum += share) > r) return state;
  return 'online';
}

/** Removes what `seedBigTown` wrote (links and radios go with their nodes). */
export async function removeBigTown(client: pg.ClientBase) {
  await client.query(`DELETE FROM nodes WHERE name LIKE $1`, [`${NODE_PREFIX}%`]);
  await client.query(`DELETE FROM sites WHERE neighbourhood_id IN (SELECT id FROM neighbourhoods WHERE name = ANY($1::text[]))`, [BIG_TOWN_QUARTERS]);
  await client.query(`DELETE FROM neighbourhoods WHERE name = ANY($1::text[])`, [BIG_TOWN_QUARTERS]);
}

/**
 * Writes `nodeCount` nodes over the twelve quarters, each on its own roof, one radio each, and a live
 * link from every node to the one before it in its quarter. Nodes count as seen just now with an hour's
 * report interval, so no silence rule touches them during a test.
 */
export async function seedBigTown(client: pg.ClientBase, nodeCount: number): Promise<BigTown> {
  await removeBigTown(client);
  const random = lcg(20261202);
  const hoods = await client.query<{ id: number; name: string }>(
    `INSERT INTO neighbourhoods (name, description) SELECT name, 'A quarter of the big test town.' FROM unnest($1::text[]) AS name RETURNING id, name`,
    [BIG_TOWN_QUARTERS],
  );
  const hoodIds = BIG_TOWN_QUARTERS.map((name) => hoods.rows.find((h) => h.name === name)!.id);
  // Quarters on a 4 × 3 grid about 1.2 km apart; roofs scattered within 400 m of their quarter's middle.
  const siteHood: number[] = [],
    siteName: string[] = [],
    lat: number[] = [],
    lon: number[] = [],
    nodeState: NodeState[] = [];
  for (let i = 0; i < nodeCount; i++) {
    const q = i % BIG_TOWN_QUARTERS.length;
    const northM = (Math.floor(q / 4) - 1) * 1200 + (random() - 0.5) * 800;
    const eastM = ((q % 4) - 1.5) * 1200 + (random() - 0.5) * 800;
    siteHood.push(hoodIds[q]);
    siteName.push(`${NODE_PREFIX}roof-${i}`);
    lat.push(CENTRE.latitude + northM / 111_195);
    lon.push(CENTRE.longitude + eastM / (111_195 * Math.cos((CENTRE.latitude * Math.PI) / 180)));
    nodeState.push(pickState(random()));
  }
  const sites = await client.query<{ id: number; name: string }>(
    `INSERT INTO sites (neighbourhood_id, name, latitude, longitude, antenna_height_m)
     SELECT * , 8 FROM unnest($1::int[], $2::text[], $3::float8[], $4::float8[]) RETURNING id, name`,
    [siteHood, siteName, lat, lon],
  );
  const siteIdByName = new Map(sites.rows.map((s) => [s.name, s.id]));
  const nodes = await client.query<{ id: number; name: string; neighbourhoodId: number; state: NodeState }>(
    `INSERT INTO nodes (site_id, neighbourhood_id, name, state, state_since, last_seen_at, report_interval_s, firmware)
     SELECT site_id, hood_id, name, state, now(), now(), 3600, 'Tilecrest 3.2'
       FROM unnest($1::int[], $2::int[], $3::text[], $4::text[]) AS t(site_id, hood_id, name, state)
     RETURNING id, name, neighbourhood_id AS "neighbourhoodId", state`,
    [siteName.map((n) => siteIdByName.get(n)!), siteHood, siteName.map((_, i) => `${NODE_PREFIX}${i}`), nodeState],
  );
  await client.query(
    `INSERT INTO radios (node_id, iface, band, channel, channel_width_mhz, tx_power_dbm, antenna_gain_dbi, role, encryption, pre_shared_key)
     SELECT id, 'wlan0', '5', 36, 20, 18, 16, 'mesh', 'wpa2-ccmp', 'big-town-passphrase' FROM nodes WHERE name LIKE $1`,
    [`${NODE_PREFIX}%`],
  );
  const links = await client.query(
    `INSERT INTO links (name, radio_a_id, radio_b_id, status)
     SELECT NULL, previous, radio, 'live' FROM (
       SELECT r.id AS radio, lag(r.id) OVER (PARTITION BY n.neighbourhood_id ORDER BY n.id) AS previous
         FROM radios r JOIN nodes n ON n.id = r.node_id WHERE n.name LIKE $1) pairs
      WHERE previous IS NOT NULL`,
    [`${NODE_PREFIX}%`],
  );
  return {
    neighbourhoods: BIG_TOWN_QUARTERS.map((name, i) => ({ id: hoodIds[i], name })),
    nodes: nodes.rows.sort((a, b) => a.id - b.id),
    linkCount: links.rowCount ?? 0,
  };
}

/** What the page's frames looked like: gaps between animation frames, and the long frames the browser reported. */
export interface FrameFigures {
  frames: number;
  p50: number;
  p99: number;
  max: number;
  longFrames: number;
  longestLongFrame: number;
}

type PageLike = { evaluate<R, A>(fn: (arg: A) => R | Promise<R>, arg: A): Promise<R> };

/** Starts counting frame gaps (requestAnimationFrame) and long animation frames in the page. */
export async function startFrameStats(page: PageLike) {
  await page.evaluate(() => {
    const w = window as unknown as { frameStats: { gaps: number[]; longFrames: number[]; running: boolean } };
    w.frameStats = { gaps: [], longFrames: [], running: true };
    let last = performance.now();
    const tick = (now: number) => {
      w.frameStats.gaps.push(now - last);
      last = now;
      if (w.frameStats.running) requestAnimationFrame(tick);
    };
    requestAnimationFrame(tick);
    for (const type of ['long-animation-frame', 'longtask']) {
      if (!PerformanceObserver.supportedEntryTypes.includes(type)) continue;
      new PerformanceObserver((list) => list.getEntries().forEach((e) => w.frameStats.longFrames.push(e.duration))).observe({ type });
      break;
    }
  }, undefined);
}

/** The figures since the start or the last read; `stop` ends the counting. */
export async function readFrameStats(page: PageLike, stop = false): Promise<FrameFigures> {
  return page.evaluate((end) => {
    const w = window as unknown as { frameStats: { gaps: number[]; longFrames: number[]; running: boolean } };
    if (end) w.frameStats.running = false;
    const gaps = [...w.frameStats.gaps].sort((a, b) => a - b);
    const long = w.frameStats.longFrames;
    const at = (share: number) => gaps[Math.min(gaps.length - 1, Math.floor(gaps.length * share))] ?? 0;
    const figures = {
      frames: gaps.length,
      p50: at(0.5),
      p99: at(0.99),
      max: gaps.at(-1) ?? 0,
      longFrames: long.length,
      longestLongFrame: Math.max(0, ...long),
    };
    w.frameStats.gaps = [];
    w.frameStats.longFrames = [];
    return figures;
  }, stop);
}

export const frameLine = (f: FrameFigures) =>
  `${f.frames} frames; gap p50 ${f.p50.toFixed(1)} ms, p99 ${f.p99.toFixed(1)} ms, longest ${f.max.toFixed(1)} ms; ` +
  `long frames reported ${f.longFrames}, longest ${f.longestLongFrame.toFixed(0)} ms`;

/**
 * `eventsPerS` node:state events for `seconds`, to random big-town nodes, sent through a second socket.io
 * instance on the same PostgreSQL adapter: they reach the app's sockets as they do from another app instance.
 * Returns how many were sent, over how long, and each node's last state.
 */
export async function sendStateStorm(databaseUrl: string, town: BigTown, eventsPerS: number, seconds: number) {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 2 });
  const io = new Server();
  io.adapter(createAdapter(pool, { tableName: 'socket_io_attachments' }));
  const states = new Map(town.nodes.map((n) => [n.id, n.state]));
  const random = lcg(7);
  const changing: NodeState[] = ['online', 'degraded', 'offline', 'maintenance'];
  let sent = 0;
  const started = Date.now();
  try {
    // A few events every 10 ms; the loop catches up after a late timer so the rate holds on average.
    while (Date.now() - started < seconds * 1000) {
      const due = Math.floor(((Date.now() - started) / 1000) * eventsPerS);
      for (; sent < due; sent++) {
        const node = town.nodes[Math.floor(random() * town.nodes.length)];
        const previousState = states.get(node.id)!;
        const state = changing[Math.floor(random() * changing.length)];
        states.set(node.id, state);
        const event: NodeStateEvent = {
          nodeId: node.id,
          neighbourhoodId: node.neighbourhoodId,
          hostUserId: null,
          state,
          previousState,
          at: new Date().toISOString(),
          reason: 'big-town storm',
        };
        io.to('admins').emit('node:state', event);
      }
      await new Promise((resolve) => setTimeout(resolve, 10));
    }
    return { sent, seconds: (Date.now() - started) / 1000, states };
  } finally {
    // Not io.close(): this server was never attached to HTTP, so only its adapter needs closing.
    await io.of('/').adapter.close();
    await pool.end();
  }
}

/** "online:12,offline:3": a quarter's counts by state as its mark's data-counts attribute writes them. */
export function countsIn(town: BigTown, hoodId: number, states: Map<number, NodeState>): string {
  const counts = new Map<NodeState, number>();
  for (const node of town.nodes) if (node.neighbourhoodId === hoodId) counts.set(states.get(node.id)!, (counts.get(states.get(node.id)!) ?? 0) + 1);
  return NODE_STATES.filter((s) => counts.get(s))
    .map((s) => `${s}:${counts.get(s)}`)
    .join(',');
}
