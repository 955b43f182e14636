import { QueryTypes, type Sequelize } from 'sequelize';
import { Neighbourhood, NetworkSettings, Node, Site } from '../models';
import type { Actor } from '../policies/actor';
import { windowsOf } from './maintenanceWindows';
import { availabilityOf } from './nodeAvailability';

const OUTAGES_PER_NODE = 5;

export interface RecentOutageRow {
  id: number;
  nodeId: number;
  startedAt: Date;
  endedAt: Date | null;
  acknowledgedAt: Date | null;
}

/**
 * The sites the caller hosts (whatever their role), their nodes with availability, each node's last five outages
 * and its maintenance windows.
 */
export async function hostedSitesOf(sequelize: Sequelize, actor: Actor, now: Date) {
  const sites = await Site.findAll({ where: { hostUserId: actor.id }, order: [['name', 'ASC']] });
  const siteIds = sites.map((s) => s.id);
  const [nodes, neighbourhoods, settings] = await Promise.all([
    Node.findAll({ where: { siteId: siteIds }, order: [['name', 'ASC']] }),
    Neighbourhood.findAll({ where: { id: [...new Set(sites.map((s) => s.neighbourhoodId))] } }),
    NetworkSettings.findByPk(1),
  ]);
  const [availability, windows] = await Promise.all([availabilityOf(sequelize, nodes, now), Promise.all(nodes.map((n) => windowsOf(n.id)))]);
  const outages = nodes.length
    ? await sequelize.query<RecentOutageRow>(
        `SELECT id, node_id AS "nodeId", started_at AS "startedAt", ended_at AS "endedAt", acknowledged_at AS "acknowledgedAt"
           FROM (SELECT o.*, row_number() OVER (PARTITION BY node_id ORDER BY started_at DESC) AS k FROM outages o WHERE node_id = ANY($1::int[])) x
          WHERE k <= $2 ORDER BY started_at DESC`,
        { bind: [nodes.map((n) => n.id), OUTAGES_PER_NODE], type: QueryTypes.SELECT },
      )
    : [];
  const windowsByNode = new Map(nodes.map((n, i) => [n.id, windows[i]]));
  return { sites, nodes, neighbourhoods, availability, outages, windowsByNode, timeZone: settings?.timeZone ?? 'UTC' };
}
