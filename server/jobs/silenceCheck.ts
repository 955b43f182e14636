import { QueryTypes, type Sequelize } from 'sequelize';
import type { NodeState } from '../../shared/enums';
import { DEFAULT_THRESHOLDS } from '../../shared/health/state';
import { emitTransition, recordTransition } from '../services/nodeHealth';
import { thresholdsFor } from '../services/thresholds';
import { asLeader } from './leader';

interface SilentNode {
  nodeId: number;
  neighbourhoodId: number;
  hostUserId: number | null;
  state: NodeState;
  outageStartedAt: Date;
}

/**
 * Finds nodes that missed their reports and marks them offline, opening an outage each.
 * If the check itself has not run for a while (Parapet was down), it starts watching afresh
 * and gives every node one full offline window of fresh reports before judging it.
 */
export async function runSilenceCheck(sequelize: Sequelize, now: Date, checkIntervalMs: number) {
  const network = await thresholdsFor(sequelize, null);
  const result = await asLeader(sequelize, 'silence-check', async (transaction) => {
    const [job] = await sequelize.query<{ lastRunAt: Date | null; watchingSince: Date | null }>(
      `SELECT last_run_at AS "lastRunAt", watching_since AS "watchingSince" FROM job_state WHERE name = 'silence-check'`,
      { type: QueryTypes.SELECT, transaction },
    );
    const gapMs = job?.lastRunAt ? now.getTime() - new Date(job.lastRunAt).getTime() : Infinity;
    const resumed = gapMs > Math.max(3 * checkIntervalMs, 1000);
    const watchingSince = resumed || !job?.watchingSince ? now : new Date(job.watchingSince);
    await sequelize.query(
      `INSERT INTO job_state (name, last_run_at, watching_since) VALUES ('silence-check', $1, $2)
       ON CONFLICT (name) DO UPDATE SET last_run_at = $1, watching_since = $2`,
      { bind: [now, watchingSince], transaction },
    );
    const silent = await sequelize.query<SilentNode>(
      `SELECT n.id AS "nodeId", n.neighbourhood_id AS "neighbourhoodId", s.host_user_id AS "hostUserId", n.state,
              n.last_seen_at + make_interval(secs => n.report_interval_s) AS "outageStartedAt"
         FROM nodes n JOIN sites s ON s.id = n.site_id,
              LATERAL (SELECT n.report_interval_s * coalesce((n.thresholds->>'offlineAfterIntervals')::int, $2) AS window_s) w
        WHERE n.state IN ('online', 'degraded')
          AND greatest(n.last_seen_at, $3) + make_interval(secs => w.window_s) <= $1
        ORDER BY n.id
        FOR UPDATE OF n`,
      { bind: [now, network.offlineAfterIntervals ?? DEFAULT_THRESHOLDS.offlineAfterIntervals, watchingSince], type: QueryTypes.SELECT, transaction },
    );
    const events = [];
    for (const node of silent) {
      await sequelize.query(`UPDATE nodes SET state = 'offline', state_since = $2, health_streak = 0, health_reason = 'missed its reports' WHERE id = $1`, {
        bind: [node.nodeId, now],
        transaction,
      });
      events.push(
        await recordTransition(
          sequelize,
          { ...node, from: node.state, to: 'offline', reason: 'missed its reports', at: now, outageStartedAt: new Date(node.outageStartedAt) },
          transaction,
        ),
      );
    }
    return { resumed, silenced: silent.length, events };
  });
  if (!result) return { leader: false, resumed: false, silenced: 0 };
  result.events.forEach(emitTransition);
  return { leader: true, resumed: result.resumed, silenced: result.silenced };
}
