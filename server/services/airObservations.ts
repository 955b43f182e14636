import { QueryTypes, type Sequelize } from 'sequelize';
import type { RadioMove } from '../../shared/schemas/radio';

/** One radio naming another as its peer: the latest such report in the window, either direction. */
export interface PairSighting {
  radioAId: number;
  nodeAId: number;
  radioBId: number;
  nodeBId: number;
  signalDbm: number | null;
  lastSeenAt: Date;
}

// Per (node, interface, peer) the last time in the window that a report named the peer (a hash
// aggregate, no sort over the day), with the latest signal from the short observed window only;
// resolved to inventory radios: the reporter by node and interface, the peer by the MAC its radio
// last reported for itself. The time range prunes heartbeat partitions; nothing is written on the
// report path for this.
const SIGHTINGS_SQL = `
WITH day AS (
  SELECT h.node_id, h.iface, lower(h.peer_mac) AS peer_mac, max(h.received_at) AS at
    FROM heartbeat_radio_rows h
   WHERE h.received_at > $1 AND h.received_at <= $2 AND h.peer_mac IS NOT NULL
     AND ($3::int[] IS NULL OR h.node_id = ANY($3::int[]))
   GROUP BY 1, 2, 3
),
recent AS (
  SELECT DISTINCT ON (h.node_id, h.iface, lower(h.peer_mac)) h.node_id, h.iface, lower(h.peer_mac) AS peer_mac, h.signal_dbm
    FROM heartbeat_radio_rows h
   WHERE h.received_at > $4 AND h.received_at <= $2 AND h.peer_mac IS NOT NULL
     AND ($3::int[] IS NULL OR h.node_id = ANY($3::int[]))
   ORDER BY h.node_id, h.iface, lower(h.peer_mac), h.received_at DESC
)
SELECT r.id AS "radioId", r.node_id AS "nodeId", p.id AS "peerRadioId", p.node_id AS "peerNodeId", rc.signal_dbm AS "signalDbm", d.at
  FROM day d LEFT JOIN recent rc USING (node_id, iface, peer_mac)
       JOIN radios r ON r.node_id = d.node_id AND r.iface = d.iface
       JOIN radios p ON p.mac = d.peer_mac AND p.node_id <> r.node_id`;

const pairKey = (x: number, y: number) => (x < y ? `${x}:${y}` : `${y}:${x}`);

/**
 * Which radio pairs the air shows talking since `since`, keyed by the unordered pair of radio ids.
 * A pair counts when a report from either end names the other end's radio as its peer; its signal is
 * the latest report's if that came after `signalSince` (else null). `nodeIds` limits the reporting
 * nodes (null: all).
 */
export async function pairSightings(
  sequelize: Sequelize,
  since: Date,
  until: Date,
  signalSince: Date,
  nodeIds: number[] | null,
): Promise<Map<string, PairSighting>> {
  const rows = await sequelize.query<{ radioId: number; nodeId: number; peerRadioId: number; peerNodeId: number; signalDbm: number | null; at: Date }>(
    SIGHTINGS_SQL,
    { bind: [since, until, nodeIds, signalSince], type: QueryTypes.SELECT },
  );
  const pairs = new Map<string, PairSighting>();
  for (const r of rows) {
    const key = pairKey(r.radioId, r.peerRadioId);
    const at = new Date(r.at);
    const known = pairs.get(key);
    if (known && known.lastSeenAt >= at) continue;
    // Lower radio id first, so a pair reads the same whichever end reported last.
    const [a, b] =
      r.radioId < r.peerRadioId
        ? [
            [r.radioId, r.nodeId],
            [r.peerRadioId, r.peerNodeId],
          ]
        : [
            [r.peerRadioId, r.peerNodeId],
            [r.radioId, r.nodeId],
          ];
    pairs.set(key, { radioAId: a[0], nodeAId: a[1], radioBId: b[0], nodeBId: b[1], signalDbm: r.signalDbm, lastSeenAt: at });
  }
  return pairs;
}

export interface InventoryLinkAir {
  id: number;
  radioAId: number;
  radioBId: number;
  createdAt: Date;
  /** Whether either end's MAC is known, so a report naming it could be recognised at all. */
  listenable: boolean;
}

export interface LinkAir {
  observed: boolean;
  observedSignalDbm: number | null;
  lastObservedAt: string | null;
  /** In the inventory, listenable, and nobody has named either end for the whole silent window. */
  plannedButSilent: boolean;
}

export interface AirWindows {
  /** A link is observed when a report named its peer this recently (900 s in the contract). */
  observedWindowS: number;
  /** A listenable link nobody observed for this long is flagged "planned but silent". */
  silentAfterS: number;
}

/** The inventory links between the given nodes (all when null) with their radios' MAC knowledge. */
export async function inventoryLinks(sequelize: Sequelize, nodeIds: number[] | null): Promise<InventoryLinkAir[]> {
  return sequelize.query<InventoryLinkAir>(
    `SELECT l.id, l.radio_a_id AS "radioAId", l.radio_b_id AS "radioBId", l.created_at AS "createdAt", (ra.mac IS NOT NULL OR rb.mac IS NOT NULL) AS listenable
       FROM links l JOIN radios ra ON ra.id = l.radio_a_id JOIN radios rb ON rb.id = l.radio_b_id
      WHERE $1::int[] IS NULL OR (ra.node_id = ANY($1::int[]) AND rb.node_id = ANY($1::int[]))`,
    { bind: [nodeIds], type: QueryTypes.SELECT },
  );
}

/**
 * What the air says about inventory links, and the talking pairs the inventory lacks. Reads the
 * silent window once (it contains the observed window).
 */
export async function airView(sequelize: Sequelize, now: Date, windows: AirWindows, nodeIds: number[] | null) {
  const since = new Date(now.getTime() - Math.max(windows.silentAfterS, windows.observedWindowS) * 1000);
  const observedSince = now.getTime() - windows.observedWindowS * 1000;
  const [pairs, links] = await Promise.all([pairSightings(sequelize, since, now, new Date(observedSince), nodeIds), inventoryLinks(sequelize, nodeIds)]);
  const silentBefore = now.getTime() - windows.silentAfterS * 1000;
  const byLink = new Map<number, LinkAir>();
  const inventoryPairs = new Set<string>();
  for (const l of links) {
    const key = pairKey(l.radioAId, l.radioBId);
    inventoryPairs.add(key);
    const seen = pairs.get(key);
    const observed = Boolean(seen && seen.lastSeenAt.getTime() > observedSince);
    const lastHeard = seen?.lastSeenAt.getTime() ?? new Date(l.createdAt).getTime();
    byLink.set(l.id, {
      observed,
      observedSignalDbm: observed ? seen!.signalDbm : null,
      lastObservedAt: seen ? seen.lastSeenAt.toISOString() : null,
      plannedButSilent: l.listenable && lastHeard <= silentBefore,
    });
  }
  const inScope = (id: number) => nodeIds === null || nodeIds.includes(id);
  const discoveredLinks = [...pairs.entries()]
    .filter(([key, p]) => !inventoryPairs.has(key) && p.lastSeenAt.getTime() > observedSince && inScope(p.nodeAId) && inScope(p.nodeBId))
    .map(([, p]) => ({
      nodeAId: p.nodeAId,
      nodeBId: p.nodeBId,
      radioAId: p.radioAId,
      radioBId: p.radioBId,
      signalDbm: p.signalDbm,
      lastSeenAt: p.lastSeenAt.toISOString(),
    }))
    .sort((x, y) => x.radioAId - y.radioAId || x.radioBId - y.radioBId);
  return { byLink, discoveredLinks };
}

/** MACs seen moving between nodes since `since`, touching any of the given nodes (all when null), newest first. */
export async function radioMoves(sequelize: Sequelize, since: Date, nodeIds: number[] | null, limit = 50): Promise<RadioMove[]> {
  const rows = await sequelize.query<Omit<RadioMove, 'at'> & { at: Date }>(
    `SELECT m.id, m.mac, m.from_node_id AS "fromNodeId", nf.name AS "fromNodeName", m.from_iface AS "fromIface",
            m.to_node_id AS "toNodeId", nt.name AS "toNodeName", m.to_iface AS "toIface", m.at
       FROM radio_mac_moves m JOIN nodes nf ON nf.id = m.from_node_id JOIN nodes nt ON nt.id = m.to_node_id
      WHERE m.at > $1 AND ($2::int[] IS NULL OR m.from_node_id = ANY($2::int[]) OR m.to_node_id = ANY($2::int[]))
      ORDER BY m.at DESC, m.id DESC LIMIT $3`,
    { bind: [since, nodeIds, limit], type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({ ...r, at: new Date(r.at).toISOString() }));
}

/** A radio that came from or went to a node the caller may not read keeps that node's name to itself. */
export function maskMove<T extends { fromNodeId: number; fromNodeName: string; toNodeId: number; toNodeName: string }>(m: T, readable: number[]): T {
  const hidden = 'a node outside your neighbourhoods';
  return {
    ...m,
    fromNodeName: readable.includes(m.fromNodeId) ? m.fromNodeName : hidden,
    toNodeName: readable.includes(m.toNodeId) ? m.toNodeName : hidden,
  };
}
