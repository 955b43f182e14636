import { QueryTypes, type Sequelize } from 'sequelize';
import type { LinkStatus, NodeState } from '../../shared/enums';
import type { Config } from '../config';
import { type Actor, isAdmin } from '../policies/actor';
import { nodeScopeSql } from '../policies/node';
import { maskMove, radioMoves } from './airObservations';
import { recentAirView } from './airViewCache';
import { linksWithPrediction } from './topologyGraph';

export interface TopologyNodeRow {
  id: number;
  name: string;
  siteId: number;
  siteName: string;
  neighbourhoodId: number;
  latitude: number;
  longitude: number;
  state: NodeState;
  isUplink: boolean;
  lastSeenAt: Date | null;
  openOutageId: number | null;
  strandedBy: number | null;
  blastNodeCount: number;
}

/** The nodes the caller may read, at their sites' coordinates, with their open outage and what it cuts off. */
export function topologyNodes(sequelize: Sequelize, actor: Actor) {
  return sequelize.query<TopologyNodeRow>(
    `SELECT n.id, n.name, n.site_id AS "siteId", s.name AS "siteName", n.neighbourhood_id AS "neighbourhoodId", s.latitude, s.longitude,
            n.state, n.is_uplink AS "isUplink", n.last_seen_at AS "lastSeenAt", o.id AS "openOutageId",
            CASE WHEN n.state = 'stranded' THEN sn.outage_id END AS "strandedBy", coalesce(o.blast_node_count, 0)::int AS "blastNodeCount"
       FROM nodes n JOIN sites s ON s.id = n.site_id
       LEFT JOIN outages o ON o.node_id = n.id AND o.ended_at IS NULL
       LEFT JOIN stranded_nodes sn ON sn.node_id = n.id AND sn.ended_at IS NULL
      WHERE ${nodeScopeSql(actor, 'n')} ORDER BY n.id`,
    { type: QueryTypes.SELECT },
  );
}

/**
 * The map's graph: the readable nodes; the links between them (an edge shows when both its nodes do)
 * with predicted margin and capacity and what the air says about them; pairs the air shows but the
 * inventory lacks; radios seen moving between nodes, other nodes' names masked.
 */
export async function topologyFor(config: Config, sequelize: Sequelize, actor: Actor) {
  const nodes = await topologyNodes(sequelize, actor);
  const ids = nodes.map((n) => n.id);
  const now = config.now();
  const windows = { observedWindowS: config.linkObservedWindowS, silentAfterS: config.linkSilentAfterS };
  const within = isAdmin(actor) ? null : ids;
  const [predicted, air, moves] = await Promise.all([
    linksWithPrediction(sequelize, within),
    recentAirView(sequelize, now, windows, within, config.airViewCacheMs),
    radioMoves(sequelize, new Date(now.getTime() - config.radioMoveShowDays * 86_400_000), within),
  ]);
  const links = predicted.map((l) => {
    const a = air.byLink.get(l.id);
    return {
      ...l,
      status: l.status as LinkStatus,
      observed: a?.observed ?? false,
      observedSignalDbm: a?.observedSignalDbm ?? null,
      lastObservedAt: a?.lastObservedAt ?? null,
      plannedButSilent: a?.plannedButSilent ?? false,
    };
  });
  const hoodOf = new Map(nodes.map((n) => [n.id, n.neighbourhoodId]));
  const discoveredLinks = air.discoveredLinks.map((d) => ({ ...d, neighbourhoodAId: hoodOf.get(d.nodeAId)!, neighbourhoodBId: hoodOf.get(d.nodeBId)! }));
  return { nodes, links, discoveredLinks, radioMoves: moves.map((m) => maskMove(m, ids)) };
}

export interface NeighbourhoodStateRow {
  neighbourhoodId: number;
  name: string;
  state: NodeState;
  count: number;
  latitude: number;
  longitude: number;
}

/**
 * Per neighbourhood holding nodes the caller may read, how many of those are in each state, with the mean
 * of their sites' coordinates: one grouped query, no links, no air view.
 */
export function neighbourhoodStates(sequelize: Sequelize, actor: Actor) {
  return sequelize.query<NeighbourhoodStateRow>(
    `SELECT n.neighbourhood_id AS "neighbourhoodId", h.name, n.state, count(*)::int AS count,
            avg(s.latitude)::float8 AS latitude, avg(s.longitude)::float8 AS longitude
       FROM nodes n JOIN sites s ON s.id = n.site_id JOIN neighbourhoods h ON h.id = n.neighbourhood_id
      WHERE ${nodeScopeSql(actor, 'n')}
      GROUP BY n.neighbourhood_id, h.name, n.state
      ORDER BY h.name, n.neighbourhood_id, n.state`,
    { type: QueryTypes.SELECT },
  );
}

export type TopologyView = Awaited<ReturnType<typeof topologyFor>>;
