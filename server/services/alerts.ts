import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { Config } from '../config';
import { quietUntil } from '../mail/quietHours';
import { hostOffline, hostOnline } from '../mail/templates/host';
import { type BehindFacts, flapSummary, operatorOffline, operatorOnline, operatorReminder, type OperatorFacts } from '../mail/templates/operator';
import { acknowledgeUrl, footerLinks, type NodeContext, nodeAudience, nodeContext, nodeUrl, type Recipient, recoveryUrl } from './alertAudience';
import { behindForMail } from './blastRadius';
import { enqueue, type OutboxKind } from './outbox';
import { writeUpstreamNotices } from './upstreamNotices';

interface OutageRow {
  id: number;
  nodeId: number;
  startedAt: Date;
  endedAt: Date | null;
}

const loadOutage = async (sequelize: Sequelize, outageId: number, transaction: Transaction) =>
  (
    await sequelize.query<OutageRow>('SELECT id, node_id AS "nodeId", started_at AS "startedAt", ended_at AS "endedAt" FROM outages WHERE id = $1', {
      bind: [outageId],
      type: QueryTypes.SELECT,
      transaction,
    })
  )[0];

/** Outage mail per node and person is capped per rolling hour; past the cap one summary, then silence. */
async function flapDecision(sequelize: Sequelize, cap: number, nodeId: number, userId: number, now: Date, transaction: Transaction) {
  const [row] = await sequelize.query<{ normal: string; summaries: string }>(
    `SELECT count(*) FILTER (WHERE dedupe_key NOT LIKE 'flap:%') AS normal, count(*) FILTER (WHERE dedupe_key LIKE 'flap:%') AS summaries
       FROM outbox WHERE node_id = $1 AND recipient_user_id = $2 AND kind IN ('node-offline', 'node-online')
        AND created_at > $3::timestamptz - interval '1 hour'`,
    { bind: [nodeId, userId, now], type: QueryTypes.SELECT, transaction },
  );
  if (Number(row.summaries) > 0) return { verdict: 'suppress' as const, changes: 0 };
  if (Number(row.normal) >= cap) return { verdict: 'summary' as const, changes: Number(row.normal) + 1 };
  return { verdict: 'send' as const, changes: 0 };
}

type MailContext = NodeContext & { behind?: BehindFacts | null };
/** `behindOnly`: an operator of a neighbourhood cut off behind the outage's node, not of the node's own. */
type OutageRecipient = Recipient & { behindOnly?: boolean };

/** The node's audience plus the operators of the neighbourhoods cut off behind it (one operator mail each). */
async function outageAudience(sequelize: Sequelize, outageId: number, nodeId: number, transaction: Transaction): Promise<OutageRecipient[]> {
  const out: OutageRecipient[] = await nodeAudience(sequelize, nodeId, transaction);
  const seen = new Set(out.map((r) => r.userId));
  const behind = await sequelize.query<{ nodeId: number }>(
    'SELECT DISTINCT ON (neighbourhood_id) node_id AS "nodeId" FROM stranded_nodes WHERE outage_id = $1 ORDER BY neighbourhood_id, node_id',
    { bind: [outageId], type: QueryTypes.SELECT, transaction },
  );
  for (const b of behind) {
    for (const r of await nodeAudience(sequelize, b.nodeId, transaction)) {
      if (r.audience !== 'operator' || seen.has(r.userId)) continue;
      seen.add(r.userId);
      out.push({ ...r, behindOnly: true });
    }
  }
  return out;
}

const operatorFacts = (config: Config, ctx: MailContext, r: Recipient, since: Date, ackUrl: string | null): OperatorFacts => ({
  recipientName: r.name,
  nodeId: ctx.nodeId,
  nodeName: ctx.nodeName,
  siteName: ctx.siteName,
  neighbourhoodName: ctx.neighbourhoodName,
  hostName: ctx.hostName,
  since,
  timeZone: ctx.timeZone,
  nodeUrl: nodeUrl(config, ctx.nodeId),
  lastSeenAt: ctx.lastSeenAt,
  lastReport: ctx.lastReport,
  neighbours: ctx.neighbours,
  ackUrl,
  behind: ctx.behind,
});
const hostFacts = (ctx: NodeContext, r: Recipient, since: Date) => ({
  recipientName: r.name,
  nodeName: ctx.nodeName,
  siteName: ctx.siteName,
  neighbourhoodName: ctx.neighbourhoodName,
  since,
  timeZone: ctx.timeZone,
  operators: ctx.operators,
});

interface OutageMail {
  kind: OutboxKind;
  dedupeKey: string;
  ctx: MailContext;
  outage: OutageRow;
  recipient: OutageRecipient;
  now: Date;
  /** Back online after an offline mail that never went out: the mail says "was down from … to …". */
  missedOffline?: boolean;
}

/** Writes one outage message (or the flap summary in its place) for one person, honouring quiet hours for hosts. */
async function writeFor(sequelize: Sequelize, config: Config, mail: OutageMail, transaction: Transaction) {
  const { kind, ctx, outage, recipient: r, now } = mail;
  const footer = footerLinks(config, r.userId, now);
  const flap = await flapDecision(sequelize, config.flapMaxPerHour, ctx.nodeId, r.userId, now, transaction);
  if (flap.verdict === 'suppress') return false;
  const downForS = ((outage.endedAt ?? now).getTime() - new Date(outage.startedAt).getTime()) / 1000;
  const since = new Date(outage.startedAt);
  const until = mail.missedOffline ? new Date(outage.endedAt ?? now) : undefined;
  const stateNow = kind === 'node-online' ? 'back online' : 'offline';
  const rendered =
    flap.verdict === 'summary'
      ? flapSummary(
          { nodeName: ctx.nodeName, neighbourhoodName: ctx.neighbourhoodName, nodeUrl: nodeUrl(config, ctx.nodeId), changes: flap.changes, stateNow },
          footer,
        )
      : r.audience === 'host'
        ? kind === 'node-online'
          ? hostOnline({ ...hostFacts(ctx, r, since), downForS, until }, footer)
          : hostOffline({ ...hostFacts(ctx, r, since), recoveryUrl: recoveryUrl(config, r.userId, outage.id, now) }, footer)
        : kind === 'node-online'
          ? operatorOnline({ ...operatorFacts(config, ctx, r, since, null), downForS, until }, footer)
          : operatorOffline(operatorFacts(config, ctx, r, since, r.behindOnly ? null : acknowledgeUrl(config, r.userId, outage.id, now)), footer);
  const dedupeKey = flap.verdict === 'summary' ? `flap:${ctx.nodeId}:${r.userId}:${Math.floor(now.getTime() / 3_600_000)}` : mail.dedupeKey;
  const notBefore = r.audience === 'host' ? quietUntil(now, ctx.timeZone, r.quietStart, r.quietEnd) : now;
  return enqueue(
    sequelize,
    {
      kind,
      userId: r.userId,
      address: r.email,
      name: r.name,
      nodeId: ctx.nodeId,
      outageId: outage.id,
      dedupeKey,
      rendered,
      unsubscribeUrl: footer.unsubscribeUrl,
      notBefore,
    },
    now,
    transaction,
  );
}

/**
 * The one writer of `node-offline` mail. Every transaction that may open an outage (the silence
 * check, a maintenance window ending) and the sweep call it before committing: it mails each open,
 * not yet mailed outage whose grace has passed, and marks it mailed.
 * The grace is decided here and nowhere else: `alertGraceS` after the node's last report (after
 * the outage's start for a node never heard from); no grace set means at once.
 */
export async function writeDueOfflineAlerts(sequelize: Sequelize, config: Config, now: Date, transaction: Transaction) {
  const due = await sequelize.query<{ id: number }>(
    `SELECT o.id FROM outages o JOIN nodes n ON n.id = o.node_id
      WHERE o.ended_at IS NULL AND o.offline_notified_at IS NULL AND n.state = 'offline'
        AND coalesce(n.last_seen_at, o.started_at) + make_interval(secs => $2) <= $1
      ORDER BY o.id FOR UPDATE OF o`,
    { bind: [now, config.alertGraceS ?? 0], type: QueryTypes.SELECT, transaction },
  );
  for (const o of due) await writeOfflineAlerts(sequelize, config, o.id, now, transaction);
  return due.length;
}

/** `node-offline` to the node's audience (hourly-digest operators read it in their digest instead). */
async function writeOfflineAlerts(sequelize: Sequelize, config: Config, outageId: number, now: Date, transaction: Transaction) {
  const outage = await loadOutage(sequelize, outageId, transaction);
  const node = outage && (await nodeContext(sequelize, outage.nodeId, transaction));
  if (!outage || !node) return 0;
  const ctx: MailContext = { ...node, behind: await behindForMail(sequelize, outageId, transaction) };
  let written = 0;
  for (const r of await outageAudience(sequelize, outageId, ctx.nodeId, transaction)) {
    if (r.audience === 'operator' && r.operatorMode === 'hourly') continue;
    const mail: OutageMail = { kind: 'node-offline', dedupeKey: `offline:${outageId}:${r.userId}`, ctx, outage, recipient: r, now };
    if (await writeFor(sequelize, config, mail, transaction)) written++;
  }
  await sequelize.query('UPDATE outages SET offline_notified_at = $2 WHERE id = $1', { bind: [outageId, now], transaction });
  // The hosts of nodes cut off behind it hear once, if they asked to, that nothing is needed from them.
  await writeUpstreamNotices(sequelize, config, outageId, now, transaction);
  return written;
}

/**
 * `node-online` with the outage's duration, only to people who were told it was offline. An offline
 * mail never tried is withdrawn instead (nobody heard of the blip); one still failing (mail trouble)
 * is withdrawn and replaced by one "was down from … to …" mail, never two stale ones.
 */
export async function writeOnlineAlerts(sequelize: Sequelize, config: Config, outageId: number, now: Date, transaction: Transaction) {
  const outage = await loadOutage(sequelize, outageId, transaction);
  const ctx = outage && (await nodeContext(sequelize, outage.nodeId, transaction));
  if (!outage || !ctx) return 0;
  const told = await sequelize.query<{ id: string; userId: number; status: string; attempts: number }>(
    `SELECT id, recipient_user_id AS "userId", status, attempts FROM outbox
      WHERE outage_id = $1 AND kind = 'node-offline' AND dedupe_key LIKE 'offline:%' AND recipient_user_id IS NOT NULL FOR UPDATE`,
    { bind: [outageId], type: QueryTypes.SELECT, transaction },
  );
  const audience = new Map((await outageAudience(sequelize, outageId, ctx.nodeId, transaction)).map((r) => [r.userId, r]));
  let written = 0;
  for (const t of told) {
    const unsent = t.status === 'pending';
    if (unsent) await sequelize.query('DELETE FROM outbox WHERE id = $1', { bind: [t.id], transaction });
    if (unsent && t.attempts === 0) continue;
    const r = audience.get(t.userId);
    if (!r) continue;
    const mail: OutageMail = { kind: 'node-online', dedupeKey: `online:${outageId}:${r.userId}`, ctx, outage, recipient: r, now, missedOffline: unsent };
    if (await writeFor(sequelize, config, mail, transaction)) written++;
  }
  return written;
}

/** `node-reminder` to the neighbourhood's operators (immediate mail) for one open, unacknowledged outage. */
export async function writeReminders(sequelize: Sequelize, config: Config, outageId: number, now: Date, transaction: Transaction) {
  const outage = await loadOutage(sequelize, outageId, transaction);
  const node = outage && (await nodeContext(sequelize, outage.nodeId, transaction));
  if (!outage || !node) return 0;
  const ctx: MailContext = { ...node, behind: await behindForMail(sequelize, outageId, transaction) };
  const [{ n }] = await sequelize.query<{ n: number }>(
    'UPDATE outages SET last_reminder_at = $2, reminders_sent = reminders_sent + 1 WHERE id = $1 RETURNING reminders_sent AS n',
    { bind: [outageId, now], type: QueryTypes.SELECT, transaction },
  );
  const since = new Date(outage.startedAt);
  let written = 0;
  for (const r of await nodeAudience(sequelize, ctx.nodeId, transaction)) {
    if (r.audience !== 'operator' || r.operatorMode !== 'immediate') continue;
    const footer = footerLinks(config, r.userId, now);
    const rendered = operatorReminder(
      { ...operatorFacts(config, ctx, r, since, acknowledgeUrl(config, r.userId, outageId, now)), downForS: (now.getTime() - since.getTime()) / 1000 },
      footer,
    );
    if (
      await enqueue(
        sequelize,
        {
          kind: 'node-reminder',
          userId: r.userId,
          address: r.email,
          name: r.name,
          nodeId: ctx.nodeId,
          outageId,
          dedupeKey: `reminder:${outageId}:${n}:${r.userId}`,
          rendered,
          unsubscribeUrl: footer.unsubscribeUrl,
        },
        now,
        transaction,
      )
    )
      written++;
  }
  return written;
}
