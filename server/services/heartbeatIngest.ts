import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { NodeState } from '../../shared/enums';
import { afterReport, snrDb } from '../../shared/health/state';
import { judgeSentAt } from '../../shared/health/clock';
import type { HeartbeatReport } from '../../shared/schemas/heartbeat';
import { driftOf } from './drift';
import { domainEvents } from './events';
import type { TokenNode } from './ingestTokens';
import { emitTransition, recordTransition } from './nodeHealth';
import { rememberMacs } from './radioMacs';
import { thresholdsFor } from './thresholds';

// One statement stores the batch and moves the node: new (node, boot id, seq) triples claim a row
// in heartbeat_seqs, and only those reach the partitioned tables, so a resent report is stored once.
// Reports arrive with their boot id ('' when the node sent none) and a sentAt that is null when the
// node's clock was plainly wrong. $4 says whether the newest report is newer than the node's last
// one. With $11 the node is only moved if it is still as it was read ($12–$14, $16); otherwise
// nothing about the node changes.
const STORE_SQL = `
WITH input AS (
  SELECT DISTINCT ON (r->>'bootId', (r->>'seq')::bigint) r->>'bootId' AS boot_id, (r->>'seq')::bigint AS seq, r
    FROM jsonb_array_elements($1::jsonb) AS r
),
fresh AS (
  INSERT INTO heartbeat_seqs (node_id, boot_id, seq, received_at)
  SELECT $2, boot_id, seq, $3 FROM input
  ON CONFLICT DO NOTHING
  RETURNING boot_id, seq
),
hb AS (
  INSERT INTO heartbeats (node_id, seq, boot_id, received_at, sent_at, uptime_s, load1, mem_free_kb, firmware, throughput_mbps, latency_ms)
  SELECT $2, i.seq, nullif(i.boot_id, ''), $3, (i.r->>'sentAt')::timestamptz, (i.r->>'uptimeS')::float8, (i.r->>'load1')::float8,
         (i.r->>'memFreeKb')::float8, i.r->>'firmware', (i.r->>'throughputMbps')::float8, (i.r->>'latencyMs')::float8
    FROM input i JOIN fresh f USING (boot_id, seq)
),
rad AS (
  INSERT INTO heartbeat_radios (node_id, seq, boot_id, received_at, iface, role, band, channel, channel_width_mhz, ssid,
                                signal_dbm, noise_dbm, tx_rate_mbps, rx_rate_mbps, clients, peer_mac)
  SELECT $2, i.seq, nullif(i.boot_id, ''), $3, x.iface, x.role, x.band, x.channel, x."channelWidthMHz", x.ssid,
         x."signalDbm", x."noiseDbm", x."txRateMbps", x."rxRateMbps", x.clients, x."peerMac"
    FROM input i JOIN fresh f USING (boot_id, seq),
         jsonb_to_recordset(coalesce(i.r->'radios', '[]'::jsonb)) AS x(iface text, role text, band text, channel int,
           "channelWidthMHz" int, ssid text, "signalDbm" float8, "noiseDbm" float8, "txRateMbps" float8,
           "rxRateMbps" float8, clients int, "peerMac" text)
),
node AS (
  UPDATE nodes SET
    last_seen_at = greatest(last_seen_at, $3),
    first_seen_at = CASE WHEN $4 THEN coalesce(first_seen_at, $3) ELSE first_seen_at END,
    last_seq = CASE WHEN $4 THEN $5::bigint ELSE last_seq END,
    last_boot_id = CASE WHEN $4 THEN nullif($15, '') ELSE last_boot_id END,
    last_report = CASE WHEN $4 THEN $6::jsonb ELSE last_report END,
    health_streak = CASE WHEN $4 THEN $7::int ELSE health_streak END,
    health_reason = CASE WHEN $4 THEN $8 ELSE health_reason END,
    drift = CASE WHEN $4 THEN $9::jsonb ELSE drift END,
    state_since = CASE WHEN $4 AND state <> $10 THEN $3 ELSE state_since END,
    state = CASE WHEN $4 THEN $10 ELSE state END
  WHERE id = $2
    AND (NOT $11 OR (last_seq IS NOT DISTINCT FROM $12::bigint AND state = $13 AND health_streak = $14
                     AND last_boot_id IS NOT DISTINCT FROM nullif($16, '')))
  RETURNING id
)
SELECT coalesce((SELECT array_agg(seq::text) FROM fresh), '{}') AS seqs, (SELECT count(*) FROM node)::int AS updated`;

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

interface NodeMemory {
  state: NodeState;
  healthStreak: number;
  lastSeq: string | null;
  lastBootId: string | null;
}

/**
 * The report that speaks for the node now: the highest seq of the boot the batch ends with (an
 * agent sends its buffer oldest first, so a batch spanning a reboot ends in the new boot).
 */
export function newestOf(reports: HeartbeatReport[]): HeartbeatReport {
  const boot = reports[reports.length - 1].bootId ?? '';
  return reports.filter((r) => (r.bootId ?? '') === boot).reduce((a, b) => (b.seq > a.seq ? b : a));
}

/**
 * Stores reports once each. The newest report (by the node's own seq) moves the node's current
 * state only if it is newer than what the node last said, so late and repeated reports are kept
 * without moving it backwards. Receive time is the server's.
 * Most reports change no state: one guarded statement (one round trip, one commit) stores them
 * and moves the node if nobody moved it since the token lookup. A state change, or a guard that
 * finds the node changed meanwhile, takes the locked path that also records the transition.
 */
export async function ingestReports(sequelize: Sequelize, node: TokenNode, reports: HeartbeatReport[], now: Date): Promise<IngestResult> {
  const newest = newestOf(reports);
  const newestBoot = newest.bootId ?? '';
  const [thresholds, drift, bootSeenBefore] = await Promise.all([
    thresholdsFor(sequelize, node.thresholds),
    driftOf(sequelize, node.nodeId, node.firmware, newest),
    newestBoot && newestBoot !== (node.lastBootId ?? '') ? bootKnown(sequelize, node.nodeId, newestBoot) : Promise.resolve(false),
  ]);
  const figures = keyFigures(newest);
  const clock = judgeSentAt(newest.sentAt, now);
  const lastReport = {
    seq: newest.seq, bootId: newest.bootId ?? null, sentAt: clock.sentAt, receivedAt: now.toISOString(), ...figures,
    uptimeS: newest.uptimeS ?? null, firmware: newest.firmware ?? null, radios: newest.radios ?? [],
    clockTrouble: clock.trouble ? { kind: clock.trouble, reportedSentAt: newest.sentAt.slice(0, 40) } : null,
  };
  // Stored as sent, except a sentAt from a plainly wrong clock, which is stored as unknown.
  const rows = reports.map((r) => ({ ...r, bootId: r.bootId ?? '', sentAt: judgeSentAt(r.sentAt, now).sentAt }));
  const judge = (m: NodeMemory) => {
    const advances = reportAdvances(m, newestBoot, newest.seq, bootSeenBefore);
    return { advances, verdict: advances ? afterReport({ state: m.state, streak: m.healthStreak }, figures, thresholds) : null };
  };
  const store = (m: NodeMemory, j: ReturnType<typeof judge>, guarded: boolean, transaction?: Transaction) =>
    sequelize.query<{ seqs: string[]; updated: number }>(STORE_SQL, {
      bind: [JSON.stringify(rows), node.nodeId, now, j.advances, newest.seq, JSON.stringify(lastReport), j.verdict?.streak ?? 0,
        j.verdict?.reason ?? null, JSON.stringify(drift), j.verdict?.state ?? m.state, guarded, m.lastSeq, m.state, m.healthStreak,
        newestBoot, m.lastBootId ?? ''],
      type: QueryTypes.SELECT,
      transaction,
    }).then(([row]) => row);

  const seen: NodeMemory = { state: node.state as NodeState, healthStreak: node.healthStreak, lastSeq: node.lastSeq, lastBootId: node.lastBootId };
  const quick = judge(seen);
  let stored: number | null = null;
  let outcome: { advances: boolean; events: Awaited<ReturnType<typeof recordTransition>> | null } | null = null;
  if (!quick.verdict || quick.verdict.state === seen.state) {
    const row = await store(seen, quick, true);
    stored = row.seqs.length;
    if (row.updated) outcome = { advances: quick.advances, events: null };
  }
  if (!outcome) {
    outcome = await sequelize.transaction(async (transaction) => {
      // The row lock orders concurrent reports and the silence check, so state never moves backwards.
      const [current] = await sequelize.query<NodeMemory>(
        'SELECT state, health_streak AS "healthStreak", last_seq::text AS "lastSeq", last_boot_id AS "lastBootId" FROM nodes WHERE id = $1 FOR UPDATE',
        { bind: [node.nodeId], type: QueryTypes.SELECT, transaction },
      );
      const j = judge(current);
      const row = await store(current, j, false, transaction);
      stored ??= row.seqs.length;
      const events = j.verdict && j.verdict.state !== current.state
        ? await recordTransition(sequelize, { ...node, from: current.state, to: j.verdict.state, reason: j.verdict.reason, at: now }, transaction)
        : null;
      return { advances: j.advances, events };
    });
  }

  if (outcome.events) emitTransition(outcome.events);
  // Only the newest report says which MAC a radio has now; cached, so it writes only on a change.
  if (outcome.advances) await rememberMacs(sequelize, node.nodeId, newest, now);
  if (outcome.advances) {
    domainEvents.emit('node-figures', {
      nodeId: node.nodeId, neighbourhoodId: node.neighbourhoodId, hostUserId: node.hostUserId, at: now.toISOString(),
      signalDbm: figures.signalDbm, snrDb: figures.snrDb, throughputMbps: figures.throughputMbps, latencyMs: figures.latencyMs,
    });
  }
  return { accepted: stored ?? 0, duplicates: reports.length - (stored ?? 0) };
}

/**
 * Whether a report is newer than what the node last said. Within one boot (or without boot ids)
 * the higher seq is newer. A boot id the node has not used before is a reboot: its reports are
 * newer whatever their seq. A boot id used before, but not the last one, is a late report from an
 * earlier boot and moves nothing.
 */
export function reportAdvances(m: Pick<NodeMemory, 'lastSeq' | 'lastBootId'>, bootId: string, seq: number, bootSeenBefore: boolean): boolean {
  if (m.lastSeq === null) return true;
  const lastBoot = m.lastBootId ?? '';
  if (bootId === lastBoot || bootId === '') return BigInt(seq) > BigInt(m.lastSeq);
  return !bootSeenBefore;
}

async function bootKnown(sequelize: Sequelize, nodeId: number, bootId: string): Promise<boolean> {
  const rows = await sequelize.query('SELECT 1 FROM heartbeat_seqs WHERE node_id = $1 AND boot_id = $2 LIMIT 1', {
    bind: [nodeId, bootId],
    type: QueryTypes.SELECT,
  });
  return rows.length > 0;
}
