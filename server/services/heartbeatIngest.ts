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
import { emitTransition, recordTransition, stateEvent, touchesOutage, type TransitionEvents } from './nodeHealth';
import { rememberMacs } from './radioMacs';
import { thresholdsFor } from './thresholds';

// One call of store_heartbeat_items (migration 0017) stores the reports of many requests (group commit)
// and moves their nodes, in one round trip with a plan PostgreSQL keeps per connection. Each item is one
// request: its node, receive time, reports and what the newest report does to the node (the function's
// comment says the rules). A report is one row of heartbeats (its radios a jsonb column); only (node, boot
// id, seq) triples not stored yet are inserted, so a resent report is stored once.
const STORE_SQL = 'SELECT k, stored, updated, cur_state, cur_streak, cur_seq, cur_boot_id FROM store_heartbeat_items($items::jsonb, $lock)';

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
  /** The item may change the node's state and the store records the move (a change that touches no outage). */
  transition: boolean;
}
interface StoreOutcome {
  stored: number;
  updated: boolean;
  /** The node as it is, when the item's guard failed (its row did not move); null when the node is gone. */
  current: NodeMemory | null;
}
interface StoreRow {
  k: number;
  stored: number;
  updated: boolean;
  cur_state: NodeState | null;
  cur_streak: number | null;
  cur_seq: string | null;
  cur_boot_id: string | null;
}
const outcomeOf = (r: StoreRow): StoreOutcome => ({
  stored: r.stored,
  updated: r.updated,
  current: r.cur_state === null ? null : { state: r.cur_state, healthStreak: r.cur_streak ?? 0, lastSeq: r.cur_seq, lastBootId: r.cur_boot_id },
});

const DEADLOCK = '40P01';
const isDeadlock = (err: unknown) => (err as { parent?: { code?: string } })?.parent?.code === DEADLOCK;

/** Stores items in one call (retried when PostgreSQL breaks a deadlock with another instance's call). */
async function storeItems(sequelize: Sequelize, items: StoreItem[], transaction?: Transaction): Promise<StoreOutcome[]> {
  const json = JSON.stringify(items.map((item, k) => ({ ...item, k })));
  // The caller's transaction already holds its node's row lock (FOR UPDATE); otherwise the function locks
  // the batch's nodes in id order, so two calls never wait on each other's nodes in a circle.
  const store = () =>
    sequelize
      .query<StoreRow>(STORE_SQL, { bind: { items: json, lock: !transaction }, type: QueryTypes.SELECT, transaction })
      .then((rows) => rows.map(outcomeOf));
  if (transaction) return store();
  for (let attempt = 1; ; attempt++) {
    try {
      return await store();
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
/** Group commits an item tries (its node moved by another writer in between) before the locked path. */
const GROUP_ATTEMPTS = 3;

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
  // Whether the newest report's boot was seen before only matters when it is not the node's last boot.
  const needsBootProbe = (m: Pick<NodeMemory, 'lastSeq' | 'lastBootId'>) => m.lastSeq !== null && newestBoot !== '' && newestBoot !== (m.lastBootId ?? '');
  const probed = needsBootProbe(node);
  const [thresholds, drift, probedBoot] = await Promise.all([
    thresholdsFor(sequelize, node.thresholds),
    driftOf(sequelize, node.nodeId, node.firmware, newest),
    probed ? bootKnown(sequelize, node.nodeId, newestBoot) : Promise.resolve(false),
  ]);
  let bootSeenBefore = probedBoot;
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
  const itemFor = (m: NodeMemory, j: ReturnType<typeof judge>, guarded: boolean, transition: boolean): StoreItem => ({
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
    transition,
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
  let outcome: { advances: boolean; events: TransitionEvents | null } | null = null;
  // A change that opens or closes no outage (a node's first report, online ⇄ degraded) is stored and recorded
  // in the group commit too, as long as the node is still as this process saw it.
  // When another writer moved the node meanwhile (another instance took its last report), the store says how the
  // node is now: judged again from there, the item tries the next group, a few times before the locked path.
  let memory: NodeMemory | null = seen;
  let verdict = quick;
  for (let attempt = 0; memory && attempt < GROUP_ATTEMPTS && !outcome; attempt++) {
    const to = verdict.verdict?.state ?? memory.state;
    if (touchesOutage(memory.state, to)) break;
    const row = await groupOf(sequelize).store(itemFor(memory, verdict, true, true));
    stored ??= row.stored;
    if (row.updated) {
      remember(memory, verdict);
      const from = memory.state;
      const moved = to !== from ? { state: stateEvent({ ...node, from, to, reason: verdict.verdict!.reason, at: now }) } : null;
      outcome = { advances: verdict.advances, events: moved };
    } else if (row.current) {
      memory = row.current;
      Object.assign(node, row.current); // what the cached token lookup carries from now on
      if (!probed && needsBootProbe(memory)) bootSeenBefore = await bootKnown(sequelize, node.nodeId, newestBoot);
      verdict = judge(memory);
    } else memory = null;
  }
  if (!outcome) {
    outcome = await sequelize.transaction(async (transaction) => {
      // The row lock orders concurrent reports and the silence check, so state never moves backwards.
      const [current] = await sequelize.query<NodeMemory>(
        'SELECT state, health_streak AS "healthStreak", last_seq::text AS "lastSeq", last_boot_id AS "lastBootId" FROM nodes WHERE id = $1 FOR UPDATE',
        { bind: [node.nodeId], type: QueryTypes.SELECT, transaction },
      );
      if (!current) throw new ApiError(401, 'bad_token', 'The node this token belonged to was removed. Add the node again and issue a new token.');
      // What this process saw said no probe was needed (a node that never reported); the row says otherwise.
      if (!probed && needsBootProbe(current)) bootSeenBefore = await bootKnown(sequelize, node.nodeId, newestBoot, transaction);
      const j = judge(current);
      const [row] = await storeItems(sequelize, [itemFor(current, j, false, false)], transaction);
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

async function bootKnown(sequelize: Sequelize, nodeId: number, bootId: string, transaction?: Transaction): Promise<boolean> {
  const rows = await sequelize.query("SELECT 1 FROM heartbeats WHERE node_id = $1 AND coalesce(boot_id, '') = $2 LIMIT 1", {
    bind: [nodeId, bootId],
    type: QueryTypes.SELECT,
    transaction,
  });
  return rows.length > 0;
}
