import { Router } from 'express';
import { QueryTypes, type Sequelize } from 'sequelize';
import { actorOf } from '../middlewares/requireUser';
import { type Actor, isAdmin } from '../policies/actor';
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

/** The graph: nodes at their sites' coordinates, links with predicted margin and capacity, both ends readable. */
export function topologyRoutes(sequelize: Sequelize) {
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
    const links = await linksWithPrediction(sequelize, nodes.map((n) => n.id));
    res.json({ data: { nodes, links } });
  });
  return router;
}
