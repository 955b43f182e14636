import type { Transporter } from 'nodemailer';
import { QueryTypes, type Sequelize } from 'sequelize';
import type { Config } from '../config';
import { createMailer, type OutgoingRow, toMailOptions } from '../mail/transport';
import { asLeader } from './leader';

/** Mail about a node's outage is time-critical: short retry ceiling, and tried for a day before giving up. */
export const OUTAGE_KINDS = ['node-offline', 'node-online', 'node-reminder', 'upstream-notice'] as const;
const OUTAGE_MAIL_GIVE_UP_MS = 24 * 3_600_000;

interface Claimed extends OutgoingRow {
  attempts: number;
  kind: string;
  createdAt: Date;
}

/**
 * Claims due messages and pushes the retry time ahead in one committed statement, so no other
 * sender (or a crash and restart) picks the same row up before its backoff has passed. The backoff is
 * exponential: base, 2×base, 4×base…, capped at six hours, or at the outage-mail ceiling (common practice, no source).
 */
async function claim(sequelize: Sequelize, config: Config, now: Date): Promise<Claimed[]> {
  const rows = await sequelize.query<Claimed & { id: string }>(
    `UPDATE outbox o SET attempts = o.attempts + 1, updated_at = $1,
            next_attempt_at = $1::timestamptz + make_interval(secs => least($2::float8 * power(2, o.attempts),
                              CASE WHEN o.kind = ANY($5::text[]) THEN $4::float8 ELSE 21600000 END) / 1000.0)
      WHERE o.id IN (SELECT id FROM outbox WHERE status = 'pending' AND next_attempt_at <= $1
                      ORDER BY next_attempt_at, id LIMIT $3 FOR UPDATE SKIP LOCKED)
      RETURNING o.id, o.recipient_address AS "recipientAddress", o.recipient_name AS "recipientName", o.subject,
                o.text_body AS "textBody", o.html_body AS "htmlBody", o.unsubscribe_url AS "unsubscribeUrl",
                o.dedupe_key AS "dedupeKey", o.attempts, o.kind, o.created_at AS "createdAt"`,
    { bind: [now, config.outboxBackoffBaseMs, config.outboxBatchSize, config.outageMailRetryMaxMs, OUTAGE_KINDS], type: QueryTypes.SELECT },
  );
  return rows.map((r) => ({ ...r, id: Number(r.id) }));
}

/** Sends every due message once; `sent` is recorded right after the SMTP server accepts it. */
export async function deliverDue(sequelize: Sequelize, config: Config, mailer: Transporter = createMailer(config)) {
  const tally = { sent: 0, retrying: 0, failed: 0 };
  for (;;) {
    const batch = await claim(sequelize, config, config.now());
    for (const row of batch) {
      try {
        await mailer.sendMail(toMailOptions(row, config));
        await sequelize.query(`UPDATE outbox SET status = 'sent', sent_at = $2, last_error = NULL, updated_at = $2 WHERE id = $1`, {
          bind: [row.id, config.now()],
        });
        tally.sent++;
      } catch (err) {
        const urgent = (OUTAGE_KINDS as readonly string[]).includes(row.kind);
        const last = urgent
          ? config.now().getTime() - new Date(row.createdAt).getTime() >= OUTAGE_MAIL_GIVE_UP_MS && row.attempts >= config.outboxMaxAttempts
          : row.attempts >= config.outboxMaxAttempts;
        const message = String((err as Error).message ?? err).slice(0, 500);
        await sequelize.query(`UPDATE outbox SET status = $2, last_error = $3, updated_at = $4 WHERE id = $1`, {
          bind: [row.id, last ? 'failed' : 'pending', message, config.now()],
        });
        if (last) tally.failed++;
        else tally.retrying++;
      }
    }
    if (batch.length < config.outboxBatchSize) return tally;
  }
}

/** One round of the sender, in one process at a time (the advisory-lock leader, like the silence check). */
export async function runOutboxSender(sequelize: Sequelize, config: Config, mailer?: Transporter) {
  const result = await asLeader(sequelize, 'outbox-sender', () => deliverDue(sequelize, config, mailer));
  return result ? { leader: true, ...result } : { leader: false, sent: 0, retrying: 0, failed: 0 };
}
