import { QueryTypes, type Sequelize } from 'sequelize';
import type { NodeState } from '../../shared/enums';
import { afterReport, snrDb } from '../../shared/health/state';
import type { HeartbeatReport } from '../../shared/schemas/heartbeat';
import { driftOf } from './drift';
import { domainEvents } from './events';
import type { TokenNode } from './ingestTokens';
import { emitTransition, recordTransition } from './nodeHealth';
import { thresholdsFor } from './thresholds';

// One statement stores the batch: new (node, seq) pairs claim a row in heartbeat_seqs, and only
// those reach the partitioned tables, so a resent report is stored once.
const STORE_SQL = `
WITH input AS (
  SELECT DISTINCT ON ((r->>'seq')::bigint) (r->>'seq')::bigint AS seq, r
    FROM jsonb_array_elements($1::jsonb) AS r
),
fresh AS (
  INSERT INTO heartbeat_seqs (node_id, seq, received_at)
  SELECT $2, seq, $3 FROM input
  ON CONFLICT DO NOTHING
  RETURNING seq
),
hb AS (
  INSERT INTO heartbeats (node_id, seq, received_at, sent_at, uptime_s, load1, mem_free_kb, firmware, throughput_mbps, latency_ms)
  SELECT $2, i.seq, $3, (i.r->>'sentAt')::timestamptz, (i.r->>'uptimeS')::float8, (i.r->>'load1')::float8,
         (i.r->>'memFreeKb')::float8, i.r->>'firmware', (i.r->>'throughputMbps')::float8, (i.r->>'latencyMs')::float8
    FROM input i JOIN fresh f USING (seq)
),
rad AS (
  INSERT INTO heartbeat_radios (node_id, seq, received_at, iface, role, band, channel, channel_width_mhz, ssid,
                                signal_dbm, noise_dbm, tx_rate_mbps, rx_rate_mbps, clients, peer_mac)
  SELECT $2, i.seq, $3, x.iface, x.role, x.band, x.channel, x."channelWidthMHz", x.ssid,
         x."signalDbm", x."noiseDbm", x."txRateMbps", x."rxRateMbps", x.clients, x."peerMac"
    FROM input i JOIN fresh f USING (seq),
         jsonb_to_recordset(coalesce(i.r->'radios', '[]'::jsonb)) AS x(iface text, role text, band text, channel int,
           "channelWidthMHz" int, ssid text, "signalDbm" float8, "noiseDbm" float8, "txRateMbps" float8,
           "rxRateMbps" float8, clients int, "peerMac" text)
)
SELECT seq::text FROM fresh`;

/** The figures health looks at: the weakest radio link the node reports, and its own measurements. */
export function keyFigures(r: HeartbeatReport) {
  let signalDbm: number | null = null;
  let snr: number | null = null;
  for (const radio of r.radios ?? []) {
    if (radio.signalDbm !== undefined && (signalDbm === null || radio.signalDbm < signalDbm)) signalDbm = radio.signalDbm;
    const s = snrDb(radio.signalDbm, radio.noiseDbm);
    if (s !== null && (snr === null || s < snr)) snr = s;
  }
  return { signalDbm, snrDb: snr, throughputMbps: r.throughputMbps ?? null, latencyMs: r.latencyMs ?? null };
}

export interface IngestResult {
  accepted: number;
  duplicates: number;
}

/**
 * Stores reports once each; the newest report (by the node's own seq) moves the node's current
 * state only if it is newer than what the node last said. Receive time is the server's.
 */
export async function ingestReports(sequelize: Sequelize, node: TokenNode, reports: HeartbeatReport[], now: Date): Promise<IngestResult> {
  const rows = await sequelize.query<{ seq: string }>(STORE_SQL, { bind: [JSON.stringify(reports), node.nodeId, now], type: QueryTypes.SELECT });
  const fresh = new Set(rows.map((r) => r.seq));
  const result = { accepted: fresh.size, duplicates: reports.length - fresh.size };

  const newest = reports.filter((r) => fresh.has(String(r.seq))).sort((a, b) => b.seq - a.seq)[0];
  const isNewer = newest && (node.lastSeq === null || BigInt(newest.seq) > BigInt(node.lastSeq));
  if (!isNewer) {
    // Late, out-of-order or repeated reports still prove the node is alive now.
    await sequelize.query('UPDATE nodes SET last_seen_at = greatest(last_seen_at, $2) WHERE id = $1', { bind: [node.nodeId, now] });
    return result;
  }
  await applyNewest(sequelize, node, newest, now);
  return result;
}

async function applyNewest(sequelize: Sequelize, node: TokenNode, report: HeartbeatReport, now: Date) {
  const thresholds = await thresholdsFor(sequelize, node.thresholds);
  const figures = keyFigures(report);
  const drift = await driftOf(sequelize, node.nodeId, node.firmware, report);
  const lastReport = { seq: report.seq, sentAt: report.sentAt, receivedAt: now.toISOString(), ...figures, uptimeS: report.uptimeS ?? null, firmware: report.firmware ?? null, radios: report.radios ?? [] };

  const events = await sequelize.transaction(async (transaction) => {
    // The row lock orders concurrent reports and the silence check, so state never moves backwards.
    const [current] = await sequelize.query<{ state: NodeState; healthStreak: number; lastSeq: string | null }>(
      'SELECT state, health_streak AS "healthStreak", last_seq::text AS "lastSeq" FROM nodes WHERE id = $1 FOR UPDATE',
      { bind: [node.nodeId], type: QueryTypes.SELECT, transaction },
    );
    if (!current) return null;
    if (current.lastSeq !== null && BigInt(current.lastSeq) >= BigInt(report.seq)) {
      await sequelize.query('UPDATE nodes SET last_seen_at = greatest(last_seen_at, $2) WHERE id = $1', { bind: [node.nodeId, now], transaction });
      return null;
    }
    const verdict = afterReport({ state: current.state, streak: current.healthStreak }, figures, thresholds);
    await sequelize.query(
      `UPDATE nodes SET last_seen_at = greatest(last_seen_at, $2), first_seen_at = coalesce(first_seen_at, $2), last_seq = $3, last_report = $4::jsonb,
              health_streak = $5, health_reason = $6, drift = $7::jsonb,
              state = $8, state_since = CASE WHEN state = $8 THEN state_since ELSE $2 END
        WHERE id = $1`,
      { bind: [node.nodeId, now, report.seq, JSON.stringify(lastReport), verdict.streak, verdict.reason, JSON.stringify(drift), verdict.state], transaction },
    );
    if (verdict.state === current.state) return null;
    return recordTransition(sequelize, { ...node, from: current.state, to: verdict.state, reason: verdict.reason, at: now }, transaction);
  });
  if (events) emitTransition(events);
  domainEvents.emit('node-figures', {
    nodeId: node.nodeId, neighbourhoodId: node.neighbourhoodId, hostUserId: node.hostUserId, at: now.toISOString(),
    signalDbm: figures.signalDbm, snrDb: figures.snrDb, throughputMbps: figures.throughputMbps, latencyMs: figures.latencyMs,
  });
}
