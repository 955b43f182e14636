import { Router } from 'express';
import { QueryTypes, type Sequelize } from 'sequelize';
import type { Config } from '../config';
import { actorOf } from '../middlewares/requireUser';
import { type Actor, isAdmin, mayManage } from '../policies/actor';
import { airView, maskMove, radioMoves } from '../services/airObservations';
import { linksWithPrediction } from '../services/topologyGraph';

interface TopoNode {
  id: number; name: string; siteId: number; siteName: string; neighbourhoodId: number; latitude: number; longitude: number;
  state: string; isUplink: boolean; lastSeenAt: string | null; openOutageId: number | null;
  /** On a stranded node: the open outage of the root it is cut off behind (null when the cut contains Parapet's own side). */
  strandedBy: number | null;
  /** On the root of an open outage: how many nodes sit behind it. */
  blastNodeCount: number;
}

/** Where the caller may look: admins all, operators their neighbourhoods, everyone the sites they host. */
function scopeSql(actor: Actor) {
  if (isAdmin(actor)) return { sql: 'true', bind: [] as unknown[] };
  return { sql: '(n.neighbourhood_id = ANY($1::int[]) OR n.site_id = ANY($2::int[]))', bind: [actor.role === 'operator' ? actor.neighbourhoodIds : [], actor.hostedSiteIds] };
}

/**
 * The graph: nodes at their sites' coordinates, links with predicted margin and capacity and what
 * the air says about them, both ends readable; pairs the air shows but the inventory lacks; radios
 * seen moving between nodes.
 */
export function topologyRoutes(config: Config, sequelize: Sequelize) {
  const router = Router();
  router.get('/', async (req, res) => {
    const actor = actorOf(req);
    const scope = scopeSql(actor);
    const nodes = await sequelize.query<TopoNode>(
      `SELECT n.id, n.name, n.site_id AS "siteId", s.name AS "siteName", n.neighbourhood_id AS "neighbourhoodId", s.latitude, s.longitude,
              n.state, n.is_uplink AS "isUplink", n.last_seen_at AS "lastSeenAt", o.id AS "openOutageId",
              CASE WHEN n.state = 'stranded' THEN sn.outage_id END AS "strandedBy", coalesce(o.blast_node_count, 0) AS "blastNodeCount"
         FROM nodes n JOIN sites s ON s.id = n.site_id
         LEFT JOIN outages o ON o.node_id = n.id AND o.ended_at IS NULL
         LEFT JOIN stranded_nodes sn ON sn.node_id = n.id AND sn.ended_at IS NULL
        WHERE ${scope.sql} ORDER BY n.id`,
      { bind: scope.bind, type: QueryTypes.SELECT },
    );
    const ids = nodes.map((n) => n.id);
    const now = config.now();
    const windows = { observedWindowS: config.linkObservedWindowS, silentAfterS: config.linkSilentAfterS };
    const [predicted, air, moves] = await Promise.all([
      linksWithPrediction(sequelize, ids),
      airView(sequelize, now, windows, isAdmin(actor) ? null : ids),
      radioMoves(sequelize, new Date(now.getTime() - config.radioMoveShowDays * 86_400_000), isAdmin(actor) ? null : ids),
    ]);
    const links = predicted.map((l) => {
      const a = air.byLink.get(l.id);
      return { ...l, observed: a?.observed ?? false, observedSignalDbm: a?.observedSignalDbm ?? null, lastObservedAt: a?.lastObservedAt ?? null, plannedButSilent: a?.plannedButSilent ?? false };
    });
    const hoodOf = new Map(nodes.map((n) => [n.id, n.neighbourhoodId]));
    // The map's "add to the inventory" shows only for those who may add a link between the two radios.
    const discoveredLinks = air.discoveredLinks.map((d) => ({
      ...d, abilities: { add: mayManage(actor, hoodOf.get(d.nodeAId)!) || mayManage(actor, hoodOf.get(d.nodeBId)!) },
    }));
    res.json({ data: { nodes, links, discoveredLinks, radioMoves: moves.map((m) => maskMove(m, ids)) } });
  });
  return router;
}

