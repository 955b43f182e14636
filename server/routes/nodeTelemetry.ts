import { Router } from 'express';
import { QueryTypes, type Sequelize } from 'sequelize';
import { z } from 'zod';
import { availabilityPct, observedInWindow, WINDOWS_S } from '../../shared/health/availability';
import { idParamsSchema } from '../../shared/schemas/common';
import type { Config } from '../config';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { readableNode } from '../services/references';

const seriesQuerySchema = z.object({ range: z.enum(['24h', '7d', '30d'], { error: 'must be 24h, 7d or 30d' }).default('24h') });
const RANGES = { '24h': { seconds: 86_400, bucketS: 300 }, '7d': { seconds: 7 * 86_400, bucketS: 3600 }, '30d': { seconds: 30 * 86_400, bucketS: 3600 } } as const;

/** Mounted at /nodes/:id: charts from the roll-ups, availability from the outages. */
export function nodeTelemetryRoutes(config: Config, sequelize: Sequelize) {
  const router = Router({ mergeParams: true });

  router.get('/series', validate('params', idParamsSchema), validate('query', seriesQuerySchema), async (req, res) => {
    const node = await readableNode(actorOf(req), res.locals.params.id);
    const range = RANGES[res.locals.query.range as keyof typeof RANGES];
    const since = new Date(config.now().getTime() - range.seconds * 1000);
    const points = await sequelize.query(
      `SELECT bucket_start AS t, availability_pct AS "availabilityPct", signal_avg_dbm AS "signalAvgDbm", signal_min_dbm AS "signalMinDbm",
              noise_avg_dbm AS "noiseAvgDbm", snr_avg_db AS "snrAvgDb", throughput_avg_mbps AS "throughputAvgMbps", latency_avg_ms AS "latencyAvgMs"
         FROM heartbeat_rollups WHERE node_id = $1 AND bucket_s = $2 AND bucket_start >= $3 ORDER BY bucket_start`,
      { bind: [node.id, range.bucketS, since], type: QueryTypes.SELECT },
    );
    res.json({ data: { range: res.locals.query.range, bucketS: range.bucketS, points } });
  });

  router.get('/availability', validate('params', idParamsSchema), async (req, res) => {
    const node = await readableNode(actorOf(req), res.locals.params.id);
    const now = config.now();
    const outages = await sequelize.query<{ start: Date; end: Date | null }>(
      'SELECT started_at AS start, ended_at AS "end" FROM outages WHERE node_id = $1 AND (ended_at IS NULL OR ended_at > $2)',
      { bind: [node.id, new Date(now.getTime() - WINDOWS_S.d90 * 1000)], type: QueryTypes.SELECT },
    );
    const intervals = outages.map((o) => ({ start: new Date(o.start), end: o.end ? new Date(o.end) : null }));
    const pct = (w: keyof typeof WINDOWS_S) => availabilityPct(observedInWindow(intervals, WINDOWS_S[w], now, node.firstSeenAt));
    res.json({ data: { h24: pct('h24'), d7: pct('d7'), d30: pct('d30'), d90: pct('d90') } });
  });

  return router;
}
