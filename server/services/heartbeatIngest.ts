import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { NodeState } from '../../shared/enums';
import { afterReport, snrDb } from '../../shared/health/state';
import { judgeSentAt } from '../../shared/health/clock';
import type { HeartbeatReport } from '../../shared/schemas/heartbeat';
import { isDatabaseUnreachable } from '../db/availability';
import { ApiError } from '../errors';
import { driftOf, type DriftItem } from './drift';
import type { Config } from '../config';
import { domainEvents } from './events';
import type { TokenNode } from './ingestTokens';
import { emitTransition, recordTransition } from './nodeHealth';
import { rememberMacs } from './radioMacs';
import { thresholdsFor } from './thresholds';

// One statement stores the reports of many requests (group commit) and moves their nodes. Each item
// is one request: its node, receive time, reports (boot id '' when the node sent none, sentAt null
// when the node's clock was plainly wrong) and what the newest report does to the node. A report is
// one row of heartbeats (its radios a jsonb column); only (node, boot id, seq) triples not stored
// yet are inserted, so a resent report is stored once. A guarded item moves its node only if the node is still as it
// was judged (seen_*); otherwise nothing about that node changes. An item whose report is not newer
// (advances false) only touches last_seen_at. A node appears in at most one item of a statement.
const STORE_SQL = `
WITH items AS (
  SELECT * FROM jsonb_to_recordset($items::jsonb) AS i(k int, node_id int, received_at timestamptz, reports jsonb, advances boolean,
    newest_seq bigint, boot_id text, last_report jsonb, streak int, reason text, drift jsonb, state text, guarded boolean,
    seen_seq bigint, seen_state text, seen_streak int, seen_boot_id text)
),
input AS (
  SELECT DISTINCT ON (i.node_id, r->>'bootId', (r->>'seq')::bigint)
         i.k, i.node_id, i.received_at, r->>'bootId' AS boot_id, (r->>'seq')::bigint AS seq, r
    FROM items i CROSS JOIN LATERAL jsonb_array_elements(i.reports) AS r
   WHERE EXISTS (SELECT 1 FROM nodes n WHERE n.id = i.node_id)
   ORDER BY i.node_id, r->>'bootId', (r->>'seq')::bigint, i.k
),
-- Exact dedupe without a second table: every writer of a node's reports holds that node's row lock from
-- before this statement until commit (storeItems locks the batch's nodes first; the locked path holds
-- FOR UPDATE). This statement's snapshot is taken after the lock is granted, so it sees every report of
-- those nodes committed before, and DISTINCT ON above removes repeats within the statement.
-- LATERAL ... LIMIT 1 keeps it one index probe per report (heartbeats_report_idx) rather than a scan of every partition.
kept AS (
  SELECT i.* FROM input i
    LEFT JOIN LATERAL (SELECT true AS found FROM heartbeats h
                        WHERE h.node_id = i.node_id AND coalesce(h.boot_id, '') = i.boot_id AND h.seq = i.seq LIMIT 1) d ON true
   WHERE d.found IS NULL
),
hb AS (
  INSERT INTO heartbeats (node_id, seq, boot_id, received_at, sent_at, uptime_s, load1, mem_free_kb, firmware, throughput_mbps, latency_ms, radios)
  SELECT i.node_id, i.seq, nullif(i.boot_id, ''), i.received_at, (i.r->>'sentAt')::timestamptz, (i.r->>'uptimeS')::float8,
         (i.r->>'load1')::float8, (i.r->>'memFreeKb')::float8, i.r->>'firmware', (i.r->>'throughputMbps')::float8, (i.r->>'latencyMs')::float8,
         coalesce(i.r->'radios', '[]'::jsonb)
    FROM kept i
),
node AS (
  UPDATE nodes n SET
    last_seen_at = greatest(n.last_seen_at, i.received_at),
    first_seen_at = CASE WHEN i.advances THEN coalesce(n.first_seen_at, i.received_at) ELSE n.first_seen_at END,
    last_seq = CASE WHEN i.advances THEN i.newest_seq ELSE n.last_seq END,
    last_boot_id = CASE WHEN i.advances THEN nullif(i.boot_id, '') ELSE n.last_boot_id END,
    last_report = CASE WHEN i.advances THEN i.last_report ELSE n.last_report END,
    health_streak = CASE WHEN i.advances THEN i.streak ELSE n.health_streak END,
    health_reason = CASE WHEN i.advances THEN i.reason ELSE n.health_reason END,
    drift = CASE WHEN i.advances THEN i.drift ELSE n.drift END,
    state_since = CASE WHEN i.advances AND n.state <> i.state THEN i.received_at ELSE n.state_since END,
    state = CASE WHEN i.advances THEN i.state ELSE n.state END
  FROM items i
  WHERE n.id = i.node_id
    AND (NOT i.guarded OR (n.last_seq IS NOT DISTINCT FROM i.seen_seq AND n.state = i.seen_state AND n.health_streak = i.seen_streak
                           AND n.last_boot_id IS NOT DISTINCT FROM nullif(i.seen_boot_id, '')))
  RETURNING i.k
)
SELECT i.k, (SELECT count(*) FROM kept x WHERE x.k = i.k)::int AS stored, EXISTS (SELECT 1 FROM node WHERE node.k = i.k) AS updated
  FROM items i ORDER BY i.k`;

/** One request's share of a store statement (snake_case: the statement reads it with jsonb_to_recordset). */
interface StoreItem {
  node_id: number;
  received_at: string;
  reports: unknown[];
  advances: boolean;
  newest_seq: number;
  boot_id: string;
  last_report: unknown;
  streak: number;
  reason: string | null;
  drift: DriftItem[];
  state: string;
  guarded: boolean;
  seen_seq: string | null;
  seen_state: string;
  seen_streak: number;
  seen_boot_id: string;
}
interface StoreOutcome {
  stored: number;
  updated: boolean;
}

const DEADLOCK = '40P01';
const isDeadlock = (err: unknown) => (err as { parent?: { code?: string } })?.parent?.code === DEADLOCK;

/** Stores items in one statement (retried when PostgreSQL breaks a deadlock with another instance's statement). */
async function storeItems(sequelize: Sequelize, items: StoreItem[], transaction?: Transaction): Promise<StoreOutcome[]> {
  const json = JSON.stringify(items.map((item, k) => ({ ...item, k })));
  const store = async (t: Transaction) => {
    const rows = await sequelize.query<{ k: number; stored: number; updated: boolean }>(STORE_SQL, {
      bind: { items: json },
      type: QueryTypes.SELECT,
      transaction: t,
    });
    return rows.map((r) => ({ stored: r.stored, updated: r.updated }));
  };
  // The caller's transaction already holds its node's row lock (FOR UPDATE).
  if (transaction) return store(transaction);
  const ids = [...new Set(items.map((i) => i.node_id))].sort((a, b) => a - b);
  for (let attempt = 1; ; attempt++) {
    try {
      return await sequelize.transaction(async (t) => {
        // In id order, so two statements never wait on each other's nodes in a circle.
        await sequelize.query('SELECT 1 FROM nodes WHERE id = ANY($1::int[]) ORDER BY id FOR NO KEY UPDATE', { bind: [ids], transaction: t });
        return store(t);
      });
    } catch (err) {
      if (attempt >= 3 || !isDeadlock(err)) throw err;
    }
  }
}

export interface GroupCommitOptions {
  /** The longest a request waits for others to share its statement. */
  windowMs: number;
  /** A statement is sent at once when this many reports are queued. */
  maxReports: number;
}
let groupOptions: GroupCommitOptions = { windowMs: 4, maxReports: 300 };

/** Ingest's group commit window (from config; the routes set it at start). */
export function configureGroupCommit(options: GroupCommitOptions) {
  groupOptions = { ...options };
}

interface Pending {
  item: StoreItem;
  resolve: (o: StoreOutcome) => void;
  reject: (err: unknown) => void;
}

/**
 * Group commit: requests that arrive within a few milliseconds of each other (or until a few hundred
 * reports are queued) are stored by one statement and one commit; each request is answered only
 * after that commit. A statement that fails for a reason other than a lost database is retried item
 * by item, so one bad request never costs the others their reports.
 */
class GroupCommit {
  private queue: Pending[] = [];
  private queuedReports = 0;
  private timer: NodeJS.Timeout | null = null;

  constructor(private readonly sequelize: Sequelize) {}

  store(item: StoreItem): Promise<StoreOutcome> {
    return new Promise((resolve, reject) => {
      this.queue.push({ item, resolve, reject });
      this.queuedReports += item.reports.length;
      if (this.queuedReports >= groupOptions.maxReports) this.flush();
      else this.timer ??= setTimeout(() => this.flush(), groupOptions.windowMs);
    });
  }

  private flush() {
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    const batch = this.queue;
    this.queue = [];
    this.queuedReports = 0;
    if (batch.length) void this.run(batch);
  }

  private async run(batch: Pending[]) {
    try {
      const outcomes = await storeItems(
        this.sequelize,
        batch.map((p) => p.item),
      );
      batch.forEach((p, i) => p.resolve(outcomes[i]));
    } catch (err) {
      if (batch.length === 1 || isDatabaseUnreachable(err)) {
        batch.forEach((p) => p.reject(err));
        return;
      }
      for (const p of batch) {
        try {
          p.resolve((await storeItems(this.sequelize, [p.item]))[0]);
        } catch (one) {
          p.reject(one);
        }
      }
    }
  }
}

const groups = new WeakMap<Sequelize, GroupCommit>();
function groupOf(sequelize: Sequelize) {
  let g = groups.get(sequelize);
  if (!g) groups.set(sequelize, (g = new GroupCommit(sequelize)));
  return g;
}

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

// Requests of one node are handled one after another in this process, so each is judged against
// what the one before it wrote (per-node order) and a node is in at most one item of a statement.
const nodeChains = new Map<number, Promise<unknown>>();

/**
 * Stores reports once each. The newest report (by the node's own seq) moves the node's current
 * state only if it is newer than what the node last said, so late and repeated reports are kept
 * without moving it backwards. Receive time is the server's.
 * Most reports change no state: they join the group commit as a guarded item that moves the node
 * only if nobody moved it since this process last saw it. A state change, or a guard that finds
 * the node changed meanwhile (another instance, the silence check), takes the locked path that
 * also records the transition. `node` carries what this process last saw of the node; it is
 * updated in place after each store, so a cached token lookup stays current.
 */
export function ingestReports(sequelize: Sequelize, config: Config, node: TokenNode, reports: HeartbeatReport[], now: Date): Promise<IngestResult> {
  const before = nodeChains.get(node.nodeId) ?? Promise.resolve();
  const run = before.catch(() => undefined).then(() => ingestInOrder(sequelize, config, node, reports, now));
  nodeChains.set(node.nodeId, run);
  void run
    .catch(() => undefined)
    .finally(() => {
      if (nodeChains.get(node.nodeId) === run) nodeChains.delete(node.nodeId);
    });
  return run;
}

async function ingestInOrder(sequelize: Sequelize, config: Config, node: TokenNode, reports: HeartbeatReport[], now: Date): Promise<IngestResult> {
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
    seq: newest.seq,
    bootId: newest.bootId ?? null,
    sentAt: clock.sentAt,
    receivedAt: now.toISOString(),
    ...figures,
    uptimeS: newest.uptimeS ?? null,
    firmware: newest.firmware ?? null,
    radios: newest.radios ?? [],
    clockTrouble: clock.trouble ? { kind: clock.trouble, reportedSentAt: newest.sentAt.slice(0, 40) } : null,
  };
  // Stored as sent, except a sentAt from a plainly wrong clock, which is stored as unknown.
  const rows = reports.map((r) => ({ ...r, bootId: r.bootId ?? '', sentAt: judgeSentAt(r.sentAt, now).sentAt }));
  const judge = (m: NodeMemory) => {
    const advances = reportAdvances(m, newestBoot, newest.seq, bootSeenBefore);
    return { advances, verdict: advances ? afterReport({ state: m.state, streak: m.healthStreak }, figures, thresholds) : null };
  };
  const itemFor = (m: NodeMemory, j: ReturnType<typeof judge>, guarded: boolean): StoreItem => ({
    node_id: node.nodeId,
    received_at: now.toISOString(),
    reports: rows,
    advances: j.advances,
    newest_seq: newest.seq,
    boot_id: newestBoot,
    last_report: lastReport,
    streak: j.verdict?.streak ?? 0,
    reason: j.verdict?.reason ?? null,
    drift,
    state: j.verdict?.state ?? m.state,
    guarded,
    seen_seq: m.lastSeq,
    seen_state: m.state,
    seen_streak: m.healthStreak,
    seen_boot_id: m.lastBootId ?? '',
  });
  // What the node is after a store that moved it.
  const remember = (m: NodeMemory, j: ReturnType<typeof judge>) => {
    const after =
      j.advances && j.verdict ? { state: j.verdict.state, healthStreak: j.verdict.streak, lastSeq: String(newest.seq), lastBootId: newestBoot || null } : m;
    Object.assign(node, after);
  };

  const seen: NodeMemory = { state: node.state as NodeState, healthStreak: node.healthStreak, lastSeq: node.lastSeq, lastBootId: node.lastBootId };
  const quick = judge(seen);
  let stored: number | null = null;
  let outcome: { advances: boolean; events: Awaited<ReturnType<typeof recordTransition>> | null } | null = null;
  if (!quick.verdict || quick.verdict.state === seen.state) {
    const row = await groupOf(sequelize).store(itemFor(seen, quick, true));
    stored = row.stored;
    if (row.updated) {
      remember(seen, quick);
      outcome = { advances: quick.advances, events: null };
    }
  }
  if (!outcome) {
    outcome = await sequelize.transaction(async (transaction) => {
      // The row lock orders concurrent reports and the silence check, so state never moves backwards.
      const [current] = await sequelize.query<NodeMemory>(
        'SELECT state, health_streak AS "healthStreak", last_seq::text AS "lastSeq", last_boot_id AS "lastBootId" FROM nodes WHERE id = $1 FOR UPDATE',
        { bind: [node.nodeId], type: QueryTypes.SELECT, transaction },
      );
      if (!current) throw new ApiError(401, 'bad_token', 'The node this token belonged to was removed. Add the node again and issue a new token.');
      const j = judge(current);
      const [row] = await storeItems(sequelize, [itemFor(current, j, false)], transaction);
      stored ??= row.stored;
      const events =
        j.verdict && j.verdict.state !== current.state
          ? await recordTransition(sequelize, config, { ...node, from: current.state, to: j.verdict.state, reason: j.verdict.reason, at: now }, transaction)
          : null;
      remember(current, j);
      return { advances: j.advances, events };
    });
  }

  if (outcome.events) emitTransition(outcome.events);
  // Only the newest report says which MAC a radio has now; cached, so it writes only on a change.
  if (outcome.advances) await rememberMacs(sequelize, node.nodeId, newest, now);
  if (outcome.advances) {
    domainEvents.emit('node-figures', {
      nodeId: node.nodeId,
      neighbourhoodId: node.neighbourhoodId,
      hostUserId: node.hostUserId,
      at: now.toISOString(),
      signalDbm: figures.signalDbm,
      snrDb: figures.snrDb,
      throughputMbps: figures.throughputMbps,
      latencyMs: figures.latencyMs,
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
  const rows = await sequelize.query("SELECT 1 FROM heartbeats WHERE node_id = $1 AND coalesce(boot_id, '') = $2 LIMIT 1", {
    bind: [nodeId, bootId],
    type: QueryTypes.SELECT,
  });
  return rows.length > 0;
}
