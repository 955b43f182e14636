import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { buildGraph, pathsToUplink, reachable } from '../../shared/health/paths';
import type { Topology } from '../../shared/health/rootCause';
import { predictLink, type RadioEnd } from './linkPrediction';

type LinkRow = { id: number; name: string | null; status: string; nodeAId: number; nodeBId: number; measuredSignalDbm: number | null } & {
  [K in keyof RadioEnd as `a_${K}` | `b_${K}`]: RadioEnd[K];
};

const end = (r: LinkRow, p: 'a' | 'b'): RadioEnd => ({
  band: r[`${p}_band`],
  channel: r[`${p}_channel`],
  channelWidthMHz: r[`${p}_channelWidthMHz`],
  txPowerDbm: r[`${p}_txPowerDbm`],
  antennaGainDbi: r[`${p}_antennaGainDbi`],
  cableLossDb: r[`${p}_cableLossDb`],
  latitude: r[`${p}_latitude`],
  longitude: r[`${p}_longitude`],
  groundElevationM: r[`${p}_groundElevationM`],
  antennaHeightM: r[`${p}_antennaHeightM`],
});

const radioCols = (p: 'a' | 'b') => `
  r${p}.band AS "${p}_band", r${p}.channel AS "${p}_channel", r${p}.channel_width_mhz AS "${p}_channelWidthMHz",
  r${p}.tx_power_dbm AS "${p}_txPowerDbm", r${p}.antenna_gain_dbi AS "${p}_antennaGainDbi", r${p}.cable_loss_db AS "${p}_cableLossDb",
  s${p}.latitude AS "${p}_latitude", s${p}.longitude AS "${p}_longitude", s${p}.ground_elevation_m AS "${p}_groundElevationM",
  s${p}.antenna_height_m AS "${p}_antennaHeightM"`;

/** Links between the given nodes (all when null) with their predicted budget from the inventory. */
export async function linksWithPrediction(sequelize: Sequelize, nodeIds: number[] | null, transaction?: Transaction) {
  const rows = await sequelize.query<LinkRow>(
    `SELECT l.id, l.name, l.status, ra.node_id AS "nodeAId", rb.node_id AS "nodeBId",
            (SELECT (x->>'signalDbm')::float8 FROM jsonb_array_elements(nb.last_report->'radios') x WHERE x->>'iface' = rb.iface LIMIT 1)
              AS "measuredSignalDbm",
            ${radioCols('a')}, ${radioCols('b')}
       FROM links l
       JOIN radios ra ON ra.id = l.radio_a_id JOIN nodes na ON na.id = ra.node_id JOIN sites sa ON sa.id = na.site_id
       JOIN radios rb ON rb.id = l.radio_b_id JOIN nodes nb ON nb.id = rb.node_id JOIN sites sb ON sb.id = nb.site_id
      WHERE $1::int[] IS NULL OR (ra.node_id = ANY($1::int[]) AND rb.node_id = ANY($1::int[]))
      ORDER BY l.id`,
    { bind: [nodeIds], type: QueryTypes.SELECT, transaction },
  );
  return rows.map((r) => {
    const p = predictLink(end(r, 'a'), end(r, 'b'));
    return {
      id: r.id,
      name: r.name,
      status: r.status,
      nodeAId: r.nodeAId,
      nodeBId: r.nodeBId,
      distanceKm: p?.distanceKm ?? null,
      predictedSignalDbm: p?.rxSignalDbm ?? null,
      fadeMarginDb: p?.fadeMarginDb ?? null,
      expectedRateMbps: p?.expectedRateMbps ?? null,
      measuredSignalDbm: r.measuredSignalDbm,
    };
  });
}

// Inventory changes bump updated_at or a count; reports and health never touch these columns.
const SIGNATURE_SQL = `
  SELECT concat_ws('|',
    (SELECT count(*) || ':' || coalesce(max(updated_at)::text, '') || ':' || count(*) FILTER (WHERE status = 'live') FROM links),
    (SELECT count(*) || ':' || coalesce(max(updated_at)::text, '') FROM radios),
    (SELECT count(*) || ':' || coalesce(max(updated_at)::text, '') || ':' || coalesce(string_agg(id::text, ',' ORDER BY id) FILTER (WHERE is_uplink), '') FROM nodes),
    (SELECT coalesce(max(updated_at)::text, '') FROM sites)) AS sig`;

let cached: { signature: string; topology: Topology } | null = null;

/**
 * The network's graph, every node's path to an uplink and what live links reach, rebuilt only
 * when the inventory changed (one signature query per call otherwise).
 */
export async function currentTopology(sequelize: Sequelize, transaction?: Transaction): Promise<Topology> {
  const [{ sig }] = await sequelize.query<{ sig: string }>(SIGNATURE_SQL, { type: QueryTypes.SELECT, transaction });
  if (cached?.signature === sig) return cached.topology;
  const nodes = await sequelize.query<{ id: number; isUplink: boolean }>('SELECT id, is_uplink AS "isUplink" FROM nodes', {
    type: QueryTypes.SELECT,
    transaction,
  });
  const links = await linksWithPrediction(sequelize, null, transaction);
  const graph = buildGraph(
    nodes,
    links.map((l) => ({ id: l.id, nodeAId: l.nodeAId, nodeBId: l.nodeBId, live: l.status === 'live', fadeMarginDb: l.fadeMarginDb })),
  );
  const topology = { graph, paths: pathsToUplink(graph), liveReach: reachable(graph, { liveOnly: true }) };
  cached = { signature: sig, topology };
  return topology;
}
