// A big invented town for map tests: thousands of nodes written with a few multi-row inserts.
import pg from 'pg';
import type { NodeState } from '../../shared/enums';

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
