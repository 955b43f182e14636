import { QueryTypes, type Sequelize } from 'sequelize';
import { DEFAULT_THRESHOLDS } from '../../shared/health/state';
import type { Config } from '../config';
import { writeSelfCheck } from '../services/alertDigests';
import { writeDueOfflineAlerts } from '../services/alerts';
import { applyMaintenanceWindows } from '../services/maintenance';
import { emitTransition } from '../services/nodeHealth';
import { judgeSilentNodes, type SilentNode } from '../services/silenceAttribution';
import { releaseStranded } from '../services/strandRelease';
import { thresholdsFor } from '../services/thresholds';
import { asLeader } from './leader';

/**
 * Finds nodes that missed their reports and marks them offline, opening an outage each, except
 * those whose silence a failure upstream explains (stranded, see silenceAttribution).
 * If the check itself has not run for a while (Parapet was down), it starts watching afresh
 * and gives every node one full offline window of fresh reports before judging it. An outage of
 * the database (`ownOutage`, seen by this process) counts the same way: nodes could not report.
 */
export async function runSilenceCheck(
  sequelize: Sequelize,
  config: Config,
  now: Date,
  checkIntervalMs: number,
  rootCauseWindowS = 120,
  ownOutage: { from: Date; to: Date } | null = null,
) {
  const network = await thresholdsFor(sequelize, null);
  const offlineAfterIntervals = network.offlineAfterIntervals ?? DEFAULT_THRESHOLDS.offlineAfterIntervals;
  const result = await asLeader(sequelize, 'silence-check', async (transaction) => {
    const [job] = await sequelize.query<{ lastRunAt: Date | null; watchingSince: Date | null }>(
      `SELECT last_run_at AS "lastRunAt", watching_since AS "watchingSince" FROM job_state WHERE name = 'silence-check'`,
      { type: QueryTypes.SELECT, transaction },
    );
    const gapMs = job?.lastRunAt ? now.getTime() - new Date(job.lastRunAt).getTime() : Infinity;
    const resumed = gapMs > Math.max(3 * checkIntervalMs, 1000) || ownOutage !== null;
    const watchingSince = resumed || !job?.watchingSince ? now : new Date(job.watchingSince);
    await sequelize.query(
      `INSERT INTO job_state (name, last_run_at, watching_since) VALUES ('silence-check', $1, $2)
       ON CONFLICT (name) DO UPDATE SET last_run_at = $1, watching_since = $2`,
      { bind: [now, watchingSince], transaction },
    );
    // One admin-only message when the check itself had stopped (not on a database's very first run).
    const ownGapMs = ownOutage ? Math.max(now.getTime() - ownOutage.from.getTime(), 0) : 0;
    if (resumed && job?.lastRunAt) await writeSelfCheck(sequelize, config, Math.max(Number.isFinite(gapMs) ? gapMs : 0, ownGapMs), now, transaction);
    const events = await applyMaintenanceWindows(sequelize, config, now, transaction);
    const silent = await sequelize.query<SilentNode>(
      `SELECT n.id AS "nodeId", n.neighbourhood_id AS "neighbourhoodId", s.host_user_id AS "hostUserId", n.state,
              n.last_seen_at + make_interval(secs => n.report_interval_s) AS "outageStartedAt"
         FROM nodes n JOIN sites s ON s.id = n.site_id,
              LATERAL (SELECT n.report_interval_s * coalesce((n.thresholds->>'offlineAfterIntervals')::int, $2) AS window_s) w
        WHERE n.state IN ('online', 'degraded')
          AND greatest(n.last_seen_at, $3) + make_interval(secs => w.window_s) <= $1
        ORDER BY n.id
        FOR UPDATE OF n`,
      { bind: [now, offlineAfterIntervals, watchingSince], type: QueryTypes.SELECT, transaction },
    );
    // Nodes behind a failed node or link are stranded under its outage, not given outages of their own.
    events.push(...(await judgeSilentNodes(sequelize, config, silent, now, rootCauseWindowS, offlineAfterIntervals, transaction)));
    events.push(...(await releaseStranded(sequelize, config, now, offlineAfterIntervals, transaction)));
    // Outage mail last, in this transaction: it exists exactly when the outage does, and lists what sits behind it.
    await writeDueOfflineAlerts(sequelize, config, now, transaction);
    return { resumed, silenced: silent.length, events };
  });
  if (!result) return { leader: false, resumed: false, silenced: 0 };
  result.events.forEach(emitTransition);
  return { leader: true, resumed: result.resumed, silenced: result.silenced };
}
