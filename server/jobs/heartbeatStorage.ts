import type { Sequelize } from 'sequelize';
import { asLeader } from './leader';

const DAY_MS = 86_400_000;
const day = (d: Date) => new Date(Math.floor(d.getTime() / DAY_MS) * DAY_MS);
const stamp = (d: Date) => d.toISOString().slice(0, 10).replace(/-/g, '');

/** Daily partitions of the raw reports from yesterday to `daysAhead` days out. */
export async function ensurePartitions(sequelize: Sequelize, now: Date, daysAhead: number) {
  const created: string[] = [];
  for (let i = -1; i <= daysAhead; i++) {
    const from = new Date(day(now).getTime() + i * DAY_MS);
    const to = new Date(from.getTime() + DAY_MS);
    for (const table of ['heartbeats']) {
      const name = `${table}_p${stamp(from)}`;
      try {
        const [, meta] = await sequelize.query(
          `CREATE TABLE IF NOT EXISTS ${name} PARTITION OF ${table} FOR VALUES FROM ('${from.toISOString()}') TO ('${to.toISOString()}')`,
        );
        if (meta !== undefined) created.push(name);
      } catch (err) {
        // Rows for that day already sit in the default partition (a clock far off); leave them there.
        console.warn(`partition ${name} not created: ${(err as Error).message}`);
      }
    }
  }
  return created;
}

/** Drops raw partitions past retention and deletes old rows that live outside them. */
export async function applyRetention(sequelize: Sequelize, now: Date, rawDays: number, rollupDays: number) {
  const rawCutoff = new Date(now.getTime() - rawDays * DAY_MS);
  const rollupCutoff = new Date(now.getTime() - rollupDays * DAY_MS);
  const [parts] = await sequelize.query(
    `SELECT c.relname AS name FROM pg_inherits i JOIN pg_class c ON c.oid = i.inhrelid JOIN pg_class p ON p.oid = i.inhparent
      WHERE p.relname = 'heartbeats' AND c.relname ~ '_p[0-9]{8}$'`,
  );
  const dropped: string[] = [];
  for (const { name } of parts as { name: string }[]) {
    const d = name.slice(-8);
    const end = new Date(Date.UTC(+d.slice(0, 4), +d.slice(4, 6) - 1, +d.slice(6, 8)) + DAY_MS);
    if (end <= rawCutoff) {
      await sequelize.query(`DROP TABLE IF EXISTS ${name}`);
      dropped.push(name);
    }
  }
  await sequelize.query('DELETE FROM heartbeats_default WHERE received_at < $1', { bind: [rawCutoff] });
  await sequelize.query('DELETE FROM heartbeat_rollups WHERE bucket_start < $1', { bind: [rollupCutoff] });
  return dropped;
}

// Availability per bucket = reports received ÷ reports expected (REFERENCES.md: time up ÷ time observed).
// Set-based: the raw reports are read once (r expands their radios) for the whole span and grouped by bucket, so rolling up a
// day (or five weeks of a loaded history) costs about as much per row as rolling up two buckets.
const ROLLUP_SQL = `
WITH h AS (
  SELECT node_id, to_timestamp(floor(extract(epoch FROM received_at) / $1::int) * $1::int) AS start, count(*) AS reports,
         min(throughput_mbps) AS tmin, avg(throughput_mbps) AS tavg, max(throughput_mbps) AS tmax,
         min(latency_ms) AS lmin, avg(latency_ms) AS lavg, max(latency_ms) AS lmax
    FROM heartbeats WHERE received_at >= $2::timestamptz AND received_at < $3::timestamptz GROUP BY 1, 2
), r AS (
  SELECT node_id, to_timestamp(floor(extract(epoch FROM received_at) / $1::int) * $1::int) AS start,
         min(signal_dbm) AS smin, avg(signal_dbm) AS savg, max(signal_dbm) AS smax,
         min(noise_dbm) AS nmin, avg(noise_dbm) AS navg, max(noise_dbm) AS nmax,
         min(signal_dbm - noise_dbm) AS qmin, avg(signal_dbm - noise_dbm) AS qavg, max(signal_dbm - noise_dbm) AS qmax
    FROM heartbeat_radio_rows WHERE received_at >= $2::timestamptz AND received_at < $3::timestamptz GROUP BY 1, 2
)
INSERT INTO heartbeat_rollups (node_id, bucket_s, bucket_start, reports, expected_reports, availability_pct,
  signal_min_dbm, signal_avg_dbm, signal_max_dbm, noise_min_dbm, noise_avg_dbm, noise_max_dbm,
  snr_min_db, snr_avg_db, snr_max_db, throughput_min_mbps, throughput_avg_mbps, throughput_max_mbps,
  latency_min_ms, latency_avg_ms, latency_max_ms)
SELECT n.id, $1::int, b.start,
       coalesce(h.reports, 0),
       greatest(1, $1::int / n.report_interval_s),
       least(100, 100.0 * coalesce(h.reports, 0) / greatest(1, $1::int / n.report_interval_s)),
       r.smin, r.savg, r.smax, r.nmin, r.navg, r.nmax, r.qmin, r.qavg, r.qmax,
       h.tmin, h.tavg, h.tmax, h.lmin, h.lavg, h.lmax
  FROM generate_series($2::timestamptz, $3::timestamptz - make_interval(secs => $1::int), make_interval(secs => $1::int)) AS b(start)
  JOIN nodes n ON n.created_at < b.start + make_interval(secs => $1::int) AND n.last_seen_at IS NOT NULL
  LEFT JOIN h ON h.node_id = n.id AND h.start = b.start
  LEFT JOIN r ON r.node_id = n.id AND r.start = b.start
ON CONFLICT (node_id, bucket_s, bucket_start) DO UPDATE SET
  reports = EXCLUDED.reports, expected_reports = EXCLUDED.expected_reports, availability_pct = EXCLUDED.availability_pct,
  signal_min_dbm = EXCLUDED.signal_min_dbm, signal_avg_dbm = EXCLUDED.signal_avg_dbm, signal_max_dbm = EXCLUDED.signal_max_dbm,
  noise_min_dbm = EXCLUDED.noise_min_dbm, noise_avg_dbm = EXCLUDED.noise_avg_dbm, noise_max_dbm = EXCLUDED.noise_max_dbm,
  snr_min_db = EXCLUDED.snr_min_db, snr_avg_db = EXCLUDED.snr_avg_db, snr_max_db = EXCLUDED.snr_max_db,
  throughput_min_mbps = EXCLUDED.throughput_min_mbps, throughput_avg_mbps = EXCLUDED.throughput_avg_mbps, throughput_max_mbps = EXCLUDED.throughput_max_mbps,
  latency_min_ms = EXCLUDED.latency_min_ms, latency_avg_ms = EXCLUDED.latency_avg_ms, latency_max_ms = EXCLUDED.latency_max_ms`;

/** Recomputes the last `buckets` completed buckets of each width, so late reports are counted too. */
export async function rollUp(sequelize: Sequelize, now: Date, bucketS: 300 | 3600, buckets = 2) {
  const end = Math.floor(now.getTime() / (bucketS * 1000)) * bucketS * 1000;
  const start = end - buckets * bucketS * 1000;
  await sequelize.query(ROLLUP_SQL, { bind: [bucketS, new Date(start), new Date(end)] });
}

/** Storage upkeep in one process at a time. */
export async function runStorageUpkeep(sequelize: Sequelize, now: Date, o: { daysAhead: number; rawDays: number; rollupDays: number }) {
  return asLeader(sequelize, 'storage', async () => {
    const created = await ensurePartitions(sequelize, now, o.daysAhead);
    await rollUp(sequelize, now, 300);
    await rollUp(sequelize, now, 3600);
    const dropped = await applyRetention(sequelize, now, o.rawDays, o.rollupDays);
    return { created, dropped };
  });
}
