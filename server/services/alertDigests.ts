import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { isTimeZone, localDate as zonedDate } from '../../shared/time/monthRange';
import type { Config } from '../config';
import { localMinutes } from '../mail/quietHours';
import { type ChangeLine, degradedDigest, type DigestLine, hourlyDigest, selfCheck } from '../mail/templates/digests';
import { consoleUrl, footerLinks } from './alertAudience';
import { enqueue } from './outbox';

const networkTimeZone = async (sequelize: Sequelize, transaction: Transaction) =>
  (await sequelize.query<{ tz: string }>('SELECT time_zone AS tz FROM network_settings WHERE id = 1', { type: QueryTypes.SELECT, transaction }))[0]?.tz ??
  'UTC';

/** The local calendar date (YYYY-MM-DD) in the network's time zone (an unknown zone reads as UTC). */
const localDate = (at: Date, timeZone: string) => zonedDate(at, isTimeZone(timeZone) ? timeZone : 'UTC');

/** One `self-check` per admin (not one per node) when the health check finds it had stopped running. */
export async function writeSelfCheck(sequelize: Sequelize, config: Config, gapMs: number, now: Date, transaction: Transaction) {
  const timeZone = await networkTimeZone(sequelize, transaction);
  const admins = await sequelize.query<{ id: number; name: string; email: string }>(
    `SELECT u.id, u.name, u.email FROM users u LEFT JOIN alert_preferences p ON p.user_id = u.id
      WHERE u.role = 'admin' AND u.active AND coalesce(p.admin_self_check, true) ORDER BY u.id`,
    { type: QueryTypes.SELECT, transaction },
  );
  let written = 0;
  for (const a of admins) {
    const footer = footerLinks(config, a.id, now);
    const rendered = selfCheck(
      { recipientName: a.name, gapS: Number.isFinite(gapMs) ? gapMs / 1000 : null, resumedAt: now, timeZone, consoleUrl: consoleUrl(config) },
      footer,
    );
    if (
      await enqueue(
        sequelize,
        {
          kind: 'self-check',
          userId: a.id,
          address: a.email,
          name: a.name,
          dedupeKey: `self-check:${now.toISOString()}:${a.id}`,
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

async function mark(sequelize: Sequelize, name: string, transaction: Transaction, at?: Date) {
  if (at) {
    await sequelize.query(`INSERT INTO job_state (name, marked_at) VALUES ($1, $2) ON CONFLICT (name) DO UPDATE SET marked_at = $2`, {
      bind: [name, at],
      transaction,
    });
    return null;
  }
  const [row] = await sequelize.query<{ markedAt: Date | null }>('SELECT marked_at AS "markedAt" FROM job_state WHERE name = $1', {
    bind: [name],
    type: QueryTypes.SELECT,
    transaction,
  });
  return row?.markedAt ? new Date(row.markedAt) : null;
}

/** On each new hour: one message per hourly-digest operator listing the past hour's offline and back-online changes in their neighbourhoods. */
export async function writeHourlyDigests(sequelize: Sequelize, config: Config, now: Date, transaction: Transaction) {
  const hourStart = new Date(now.getTime() - (now.getTime() % 3_600_000));
  const last = await mark(sequelize, 'alert-hourly-digest', transaction);
  if (last && last >= hourStart) return 0;
  await mark(sequelize, 'alert-hourly-digest', transaction, hourStart);
  if (!last) return 0;
  const timeZone = await networkTimeZone(sequelize, transaction);
  const rows = await sequelize.query<ChangeLine & { userId: number; name: string; email: string }>(
    `SELECT u.id AS "userId", u.name, u.email, n.name AS "nodeName", h.name AS "neighbourhoodName", t.to_state AS "toState", t.at
       FROM alert_preferences p JOIN users u ON u.id = p.user_id AND u.active AND u.role = 'operator'
       JOIN operator_assignments oa ON oa.user_id = u.id
       JOIN nodes n ON n.neighbourhood_id = oa.neighbourhood_id JOIN neighbourhoods h ON h.id = n.neighbourhood_id
       JOIN node_transitions t ON t.node_id = n.id AND t.at >= $1 AND t.at < $2 AND (t.to_state = 'offline' OR t.from_state = 'offline')
      WHERE p.operator_mode = 'hourly' ORDER BY u.id, t.at`,
    { bind: [last, hourStart], type: QueryTypes.SELECT, transaction },
  );
  return writeGrouped(rows, async (first, lines) => {
    const footer = footerLinks(config, first.userId, now);
    const rendered = hourlyDigest(
      { recipientName: first.name, lines: lines.map((l) => ({ ...l, at: new Date(l.at) })), timeZone, consoleUrl: consoleUrl(config) },
      footer,
    );
    return enqueue(
      sequelize,
      {
        kind: 'node-reminder',
        userId: first.userId,
        address: first.email,
        name: first.name,
        dedupeKey: `hourly:${first.userId}:${hourStart.toISOString()}`,
        rendered,
        unsubscribeUrl: footer.unsubscribeUrl,
      },
      now,
      transaction,
    );
  });
}

/** Once a day at the digest hour (network time): nodes degraded for hours, to their neighbourhoods' operators. */
export async function writeDegradedDigests(sequelize: Sequelize, config: Config, now: Date, transaction: Transaction) {
  const timeZone = await networkTimeZone(sequelize, transaction);
  const today = localDate(now, timeZone);
  const last = await mark(sequelize, 'alert-degraded-digest', transaction);
  if (localMinutes(now, timeZone) < config.digestHourLocal * 60 || (last && localDate(last, timeZone) === today)) return 0;
  await mark(sequelize, 'alert-degraded-digest', transaction, now);
  const rows = await sequelize.query<DigestLine & { userId: number; name: string; email: string }>(
    `SELECT u.id AS "userId", u.name, u.email, n.name AS "nodeName", h.name AS "neighbourhoodName", n.state_since AS "sinceAt", n.health_reason AS reason
       FROM users u JOIN operator_assignments oa ON oa.user_id = u.id LEFT JOIN alert_preferences p ON p.user_id = u.id
       JOIN nodes n ON n.neighbourhood_id = oa.neighbourhood_id JOIN neighbourhoods h ON h.id = n.neighbourhood_id
      WHERE u.active AND u.role = 'operator' AND coalesce(p.operator_mode, 'immediate') <> 'off' AND coalesce(p.degraded_digest, true)
        AND n.state = 'degraded' AND n.state_since <= $1::timestamptz - make_interval(secs => $2)
      ORDER BY u.id, n.name`,
    { bind: [now, config.degradedDigestAfterS], type: QueryTypes.SELECT, transaction },
  );
  return writeGrouped(rows, async (first, lines) => {
    const footer = footerLinks(config, first.userId, now);
    const rendered = degradedDigest(
      { recipientName: first.name, lines: lines.map((l) => ({ ...l, sinceAt: new Date(l.sinceAt) })), now, timeZone, consoleUrl: consoleUrl(config) },
      footer,
    );
    return enqueue(
      sequelize,
      {
        kind: 'node-reminder',
        userId: first.userId,
        address: first.email,
        name: first.name,
        dedupeKey: `degraded:${first.userId}:${today}`,
        rendered,
        unsubscribeUrl: footer.unsubscribeUrl,
      },
      now,
      transaction,
    );
  });
}

async function writeGrouped<R extends { userId: number }>(rows: R[], write: (first: R, lines: R[]) => Promise<boolean>) {
  const byUser = new Map<number, R[]>();
  for (const r of rows) byUser.set(r.userId, [...(byUser.get(r.userId) ?? []), r]);
  let written = 0;
  for (const lines of byUser.values()) if (await write(lines[0], lines)) written++;
  return written;
}
