import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { BlastRadiusDto } from '../../shared/schemas/outage';
import type { BehindFacts } from '../mail/templates/operator';
import type { Actor } from '../policies/actor';
import { mayReadNode } from '../policies/node';

/** Clients on a node's access-point radios at its last report (role as reported, else as in the inventory). */
export const CLIENTS_SQL = (alias: string) => `
  (SELECT coalesce(sum(greatest((x->>'clients')::int, 0)), 0)::int
     FROM jsonb_array_elements(CASE WHEN jsonb_typeof(${alias}.last_report->'radios') = 'array' THEN ${alias}.last_report->'radios' ELSE '[]'::jsonb END) x
    WHERE coalesce(x->>'role', (SELECT r.role FROM radios r WHERE r.node_id = ${alias}.id AND r.iface = x->>'iface')) = 'access-point'
      AND jsonb_typeof(x->'clients') = 'number')`;

interface BehindRow {
  outageId: number;
  nodeId: number;
  name: string;
  siteId: number;
  neighbourhoodId: number;
  neighbourhoodName: string;
  clients: number;
}

async function behindRows(sequelize: Sequelize, outageIds: number[], transaction?: Transaction) {
  if (!outageIds.length) return [];
  return sequelize.query<BehindRow>(
    `SELECT sn.outage_id AS "outageId", n.id AS "nodeId", n.name, n.site_id AS "siteId", sn.neighbourhood_id AS "neighbourhoodId",
            h.name AS "neighbourhoodName", sn.clients
       FROM stranded_nodes sn JOIN nodes n ON n.id = sn.node_id JOIN neighbourhoods h ON h.id = sn.neighbourhood_id
      WHERE sn.outage_id = ANY($1::int[])
      ORDER BY sn.outage_id, n.name, n.id`,
    { bind: [outageIds], type: QueryTypes.SELECT, transaction },
  );
}

/**
 * Each outage's blast radius: the nodes cut off behind its node (every node ever stranded by it,
 * including those back since), their neighbourhoods and the clients they served at their last report.
 * Node ids are listed only where the caller may read the node; the counts are whole.
 */
export async function blastRadii(sequelize: Sequelize, outageIds: number[], actor: Actor): Promise<Map<number, BlastRadiusDto>> {
  const out = new Map<number, BlastRadiusDto>(outageIds.map((id) => [id, { nodeCount: 0, neighbourhoodIds: [], clients: 0, nodeIds: [] }]));
  const readable = (r: BehindRow) => mayReadNode(actor, r);
  for (const r of await behindRows(sequelize, outageIds)) {
    const b = out.get(r.outageId)!;
    b.nodeCount++;
    b.clients += r.clients;
    if (!b.neighbourhoodIds.includes(r.neighbourhoodId)) b.neighbourhoodIds.push(r.neighbourhoodId);
    if (readable(r)) b.nodeIds.push(r.nodeId);
  }
  for (const b of out.values()) {
    b.neighbourhoodIds.sort((x, y) => x - y);
    b.nodeIds.sort((x, y) => x - y);
  }
  return out;
}

/** What the operators' mail lists behind an outage's node. */
export async function behindForMail(sequelize: Sequelize, outageId: number, transaction: Transaction): Promise<BehindFacts | null> {
  const rows = await behindRows(sequelize, [outageId], transaction);
  if (!rows.length) return null;
  return {
    nodeCount: rows.length,
    clients: rows.reduce((s, r) => s + r.clients, 0),
    neighbourhoodNames: [...new Set(rows.map((r) => r.neighbourhoodName))].sort(),
    nodes: rows.map((r) => ({ name: r.name, neighbourhoodName: r.neighbourhoodName })),
  };
}

/** Keeps the outage's two sortable counts in step with its stranded rows. */
export async function refreshBlastCounts(sequelize: Sequelize, outageId: number, transaction: Transaction) {
  await sequelize.query(
    `UPDATE outages o SET blast_node_count = b.n, blast_clients = b.c
       FROM (SELECT count(*)::int AS n, coalesce(sum(clients), 0)::int AS c FROM stranded_nodes WHERE outage_id = $1) b
      WHERE o.id = $1`,
    { bind: [outageId], transaction },
  );
}
