import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { NodeState } from '../../shared/enums';
import { DEFAULT_THRESHOLDS } from '../../shared/health/state';
import type { Config } from '../config';
import { recordTransition } from './nodeHealth';

interface Row {
  nodeId: number;
  neighbourhoodId: number;
  hostUserId: number | null;
  state: NodeState;
  fresh: boolean;
  everSeen: boolean;
  windowEndedAt: Date | null;
}

const ACTIVE = `EXISTS (SELECT 1 FROM maintenance_windows w WHERE w.node_id = n.id AND w.cancelled_at IS NULL AND w.starts_at <= $1 AND w.ends_at > $1)`;

/**
 * Moves nodes into `maintenance` while an announced window is open and back out when it is over:
 * to online if its reports are still fresh, offline if they are not (opening an outage from the
 * window's end), unknown if it never reported. Runs in the caller's transaction; returns the events.
 */
export async function applyMaintenanceWindows(sequelize: Sequelize, config: Config, now: Date, transaction: Transaction, onlyNodeId: number | null = null) {
  const common = { type: QueryTypes.SELECT, transaction } as const;
  const entering = await sequelize.query<Row>(
    `SELECT n.id AS "nodeId", n.neighbourhood_id AS "neighbourhoodId", s.host_user_id AS "hostUserId", n.state
       FROM nodes n JOIN sites s ON s.id = n.site_id
      WHERE n.state <> 'maintenance' AND ${ACTIVE} AND ($2::int IS NULL OR n.id = $2)
      ORDER BY n.id FOR UPDATE OF n`,
    { ...common, bind: [now, onlyNodeId] },
  );
  const leaving = await sequelize.query<Row>(
    `SELECT n.id AS "nodeId", n.neighbourhood_id AS "neighbourhoodId", s.host_user_id AS "hostUserId", n.state,
            n.last_seen_at IS NOT NULL AS "everSeen",
            coalesce(n.last_seen_at + make_interval(secs => n.report_interval_s * coalesce((n.thresholds->>'offlineAfterIntervals')::int,
              (SELECT (thresholds->>'offlineAfterIntervals')::int FROM network_settings WHERE id = 1), $3)) > $1, false) AS fresh,
            (SELECT max(w.ends_at) FROM maintenance_windows w WHERE w.node_id = n.id AND w.cancelled_at IS NULL AND w.ends_at <= $1) AS "windowEndedAt"
       FROM nodes n JOIN sites s ON s.id = n.site_id
      WHERE n.state = 'maintenance' AND NOT ${ACTIVE} AND ($2::int IS NULL OR n.id = $2)
      ORDER BY n.id FOR UPDATE OF n`,
    { ...common, bind: [now, onlyNodeId, DEFAULT_THRESHOLDS.offlineAfterIntervals] },
  );
  const events = [];
  for (const n of entering) events.push(await move(sequelize, config, n, 'maintenance', 'inside a maintenance window', now, transaction));
  for (const n of leaving) {
    const to: NodeState = n.fresh ? 'online' : n.everSeen ? 'offline' : 'unknown';
    const reason = n.fresh
      ? 'maintenance window ended; reporting'
      : n.everSeen
        ? 'maintenance window ended; not reporting'
        : 'maintenance window ended; never reported';
    events.push(await move(sequelize, config, n, to, reason, now, transaction, n.windowEndedAt ? new Date(n.windowEndedAt) : now));
  }
  return events;
}

async function move(sequelize: Sequelize, config: Config, n: Row, to: NodeState, reason: string, now: Date, transaction: Transaction, outageStartedAt?: Date) {
  await sequelize.query(`UPDATE nodes SET state = $2, state_since = $3, health_streak = 0, health_reason = $4 WHERE id = $1`, {
    bind: [n.nodeId, to, now, reason],
    transaction,
  });
  return recordTransition(
    sequelize,
    config,
    { nodeId: n.nodeId, neighbourhoodId: n.neighbourhoodId, hostUserId: n.hostUserId, from: n.state, to, reason, at: now, outageStartedAt },
    transaction,
  );
}
