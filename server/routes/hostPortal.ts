import { Router } from 'express';
import { QueryTypes, type Sequelize } from 'sequelize';
import { hostSummary } from '../../shared/health/hostWords';
import type { HostedSiteDto } from '../../shared/schemas/account';
import { localClock } from '../../shared/time/monthRange';
import type { Config } from '../config';
import { actorOf } from '../middlewares/requireUser';
import { Neighbourhood, NetworkSettings, Node, Site } from '../models';
import { availabilityOf } from '../services/nodeAvailability';

const OUTAGES_PER_NODE = 5;
const iso = (d: Date | null | undefined) => (d ? new Date(d).toISOString() : null);

/** Mounted at /me/nodes: the sites the caller hosts (whatever their role) and their nodes, in plain words. */
export function hostPortalRoutes(config: Config, sequelize: Sequelize) {
  const router = Router();

  router.get('/', async (req, res) => {
    const actor = actorOf(req);
    const now = config.now();
    const sites = await Site.findAll({ where: { hostUserId: actor.id }, order: [['name', 'ASC']] });
    const siteIds = sites.map((s) => s.id);
    const [nodes, hoods, settings] = await Promise.all([
      Node.findAll({ where: { siteId: siteIds }, order: [['name', 'ASC']] }),
      Neighbourhood.findAll({ where: { id: [...new Set(sites.map((s) => s.neighbourhoodId))] } }),
      NetworkSettings.findByPk(1),
    ]);
    const timeZone = settings?.timeZone ?? 'UTC';
    const availability = await availabilityOf(sequelize, nodes, now);
    const outages = nodes.length
      ? await sequelize.query<{ id: number; nodeId: number; startedAt: Date; endedAt: Date | null; acknowledgedAt: Date | null }>(
          `SELECT id, node_id AS "nodeId", started_at AS "startedAt", ended_at AS "endedAt", acknowledged_at AS "acknowledgedAt"
             FROM (SELECT o.*, row_number() OVER (PARTITION BY node_id ORDER BY started_at DESC) AS k FROM outages o WHERE node_id = ANY($1::int[])) x
            WHERE k <= $2 ORDER BY started_at DESC`,
          { bind: [nodes.map((n) => n.id), OUTAGES_PER_NODE], type: QueryTypes.SELECT },
        )
      : [];
    const clock = (d: Date | null) => (d ? localClock(new Date(d), timeZone, now) : null);
    const data: HostedSiteDto[] = sites.map((s) => ({
      id: s.id,
      name: s.name,
      neighbourhoodName: hoods.find((h) => h.id === s.neighbourhoodId)?.name ?? '',
      nodes: nodes.filter((n) => n.siteId === s.id).map((n) => ({
        id: n.id,
        name: n.name,
        state: n.state,
        stateSince: iso(n.stateSince),
        lastSeenAt: iso(n.lastSeenAt),
        summary: hostSummary({ siteName: s.name, state: n.state, lastSeenClock: clock(n.lastSeenAt), sinceClock: clock(n.stateSince) }),
        availability: availability.byNode(n.id),
        recentOutages: outages.filter((o) => o.nodeId === n.id).map((o) => ({ id: o.id, startedAt: iso(o.startedAt)!, endedAt: iso(o.endedAt), acknowledged: Boolean(o.acknowledgedAt) })),
      })),
    }));
    res.json({ data, timeZone });
  });

  return router;
}
