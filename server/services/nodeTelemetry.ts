import { QueryTypes, type Sequelize } from 'sequelize';
import { WINDOWS_S, availabilityPct, observedInWindow } from '../../shared/health/availability';
import type { SeriesRange } from '../../shared/schemas/telemetry';
import type { Node } from '../models';

const RANGES: Record<SeriesRange, { seconds: number; bucketS: number }> = {
  '24h': { seconds: 86_400, bucketS: 300 },
  '7d': { seconds: 7 * 86_400, bucketS: 3600 },
  '30d': { seconds: 30 * 86_400, bucketS: 3600 },
};

export interface SeriesRow {
  t: Date;
  availabilityPct: number | null;
  signalAvgDbm: number | null;
  signalMinDbm: number | null;
  noiseAvgDbm: number | null;
  snrAvgDb: number | null;
  throughputAvgMbps: number | null;
  latencyAvgMs: number | null;
}

/** The node's roll-up buckets over the range: five-minute buckets for a day, hourly ones beyond. */
export async function nodeSeries(sequelize: Sequelize, nodeId: number, range: SeriesRange, now: Date) {
  const { seconds, bucketS } = RANGES[range];
  const since = new Date(now.getTime() - seconds * 1000);
  const points = await sequelize.query<SeriesRow>(
    `SELECT bucket_start AS t, availability_pct AS "availabilityPct", signal_avg_dbm AS "signalAvgDbm", signal_min_dbm AS "signalMinDbm",
            noise_avg_dbm AS "noiseAvgDbm", snr_avg_db AS "snrAvgDb", throughput_avg_mbps AS "throughputAvgMbps", latency_avg_ms AS "latencyAvgMs"
       FROM heartbeat_rollups WHERE node_id = $1 AND bucket_s = $2 AND bucket_start >= $3 ORDER BY bucket_start`,
    { bind: [nodeId, bucketS, since], type: QueryTypes.SELECT },
  );
  return { range, bucketS, points };
}

/** Percent up over 24 h, 7, 30 and 90 days, from the node's outages (shared/health/availability.ts). */
export async function nodeAvailabilityWindows(sequelize: Sequelize, node: Pick<Node, 'id' | 'firstSeenAt'>, now: Date) {
  const outages = await sequelize.query<{ start: Date; end: Date | null }>(
    'SELECT started_at AS start, ended_at AS "end" FROM outages WHERE node_id = $1 AND (ended_at IS NULL OR ended_at > $2)',
    { bind: [node.id, new Date(now.getTime() - WINDOWS_S.d90 * 1000)], type: QueryTypes.SELECT },
  );
  const intervals = outages.map((o) => ({ start: new Date(o.start), end: o.end ? new Date(o.end) : null }));
  const pct = (w: keyof typeof WINDOWS_S) => availabilityPct(observedInWindow(intervals, WINDOWS_S[w], now, node.firstSeenAt));
  return { h24: pct('h24'), d7: pct('d7'), d30: pct('d30'), d90: pct('d90') };
}
