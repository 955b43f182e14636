import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { Config } from '../config';
import { recordDownMoves } from './downMoves';

/**
 * After a root comes back, the nodes stranded behind it get one full report window (from the
 * moment it came back) to report; those still silent then go offline with an outage and mail of
 * their own. Rows of nodes that reported again (or were put in maintenance) are closed.
 */
export async function releaseStranded(sequelize: Sequelize, config: Config, now: Date, offlineAfterIntervals: number, transaction: Transaction) {
  await sequelize.query(
    `UPDATE stranded_nodes sn SET ended_at = greatest(coalesce(n.state_since, $1), sn.stranded_at)
       FROM nodes n WHERE n.id = sn.node_id AND sn.ended_at IS NULL AND n.state <> 'stranded'`,
    { bind: [now], transaction },
  );
  await sequelize.query(
    `UPDATE stranded_nodes sn SET released_at = greatest(o.ended_at, sn.stranded_at)
       FROM outages o WHERE o.id = sn.outage_id AND sn.ended_at IS NULL AND sn.released_at IS NULL AND o.ended_at IS NOT NULL`,
    { transaction },
  );
  await sequelize.query(
    `UPDATE stranded_nodes sn SET released_at = greatest(coalesce(r.state_since, $1), sn.stranded_at)
       FROM nodes r WHERE r.id = sn.root_node_id AND sn.outage_id IS NULL AND sn.ended_at IS NULL AND sn.released_at IS NULL
        AND r.state IN ('online', 'degraded')`,
    { bind: [now], transaction },
  );
  await sequelize.query(
    `UPDATE stranded_nodes SET released_at = greatest($1, stranded_at) WHERE root_node_id IS NULL AND ended_at IS NULL AND released_at IS NULL`,
    { bind: [now], transaction },
  );
  const due = await sequelize.query<{ rowId: number; nodeId: number; neighbourhoodId: number; hostUserId: number | null; releasedAt: Date }>(
    `SELECT sn.id AS "rowId", n.id AS "nodeId", n.neighbourhood_id AS "neighbourhoodId", s.host_user_id AS "hostUserId", sn.released_at AS "releasedAt"
       FROM stranded_nodes sn JOIN nodes n ON n.id = sn.node_id JOIN sites s ON s.id = n.site_id
      WHERE sn.ended_at IS NULL AND sn.released_at IS NOT NULL AND n.state = 'stranded'
        AND greatest(n.last_seen_at, sn.released_at)
            + make_interval(secs => n.report_interval_s * coalesce((n.thresholds->>'offlineAfterIntervals')::int, $2)) <= $1
      ORDER BY n.id
      FOR UPDATE OF n, sn`,
    { bind: [now, offlineAfterIntervals], type: QueryTypes.SELECT, transaction },
  );
  const reason = 'still silent after the network upstream came back';
  const moves = due.map((d) => ({ ...d, from: 'stranded' as const, to: 'offline' as const, reason, outageStartedAt: new Date(d.releasedAt) }));
  if (due.length)
    await sequelize.query('UPDATE stranded_nodes SET ended_at = $2 WHERE id = ANY($1::int[])', { bind: [due.map((d) => d.rowId), now], transaction });
  const events = await recordDownMoves(sequelize, moves, now, transaction);
  return events;
}
