import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { isSafeAddress } from '../mail/headerSafe';
import type { Rendered } from '../mail/templates/compose';

export type OutboxKind = 'node-offline' | 'node-reminder' | 'node-online' | 'upstream-notice' | 'self-check' | 'invitation' | 'password-reset';

export interface NewMessage {
  kind: OutboxKind;
  userId: number | null;
  address: string;
  name: string | null;
  nodeId?: number | null;
  outageId?: number | null;
  dedupeKey: string;
  rendered: Rendered;
  unsubscribeUrl: string | null;
  /** Not before this moment (quiet hours); defaults to now. */
  notBefore?: Date;
}

/**
 * Writes one message in the caller's transaction. The dedupe key is unique, so deciding the same
 * message twice (a retried transaction, two processes) stores it once. False when it existed or the
 * address cannot safely go in a header.
 */
export async function enqueue(sequelize: Sequelize, m: NewMessage, now: Date, transaction: Transaction): Promise<boolean> {
  if (!isSafeAddress(m.address)) {
    console.warn(`outbox: not writing ${m.kind} to user ${m.userId}: the address is not a plain e-mail address`);
    return false;
  }
  const rows = await sequelize.query<{ id: string }>(
    `INSERT INTO outbox (kind, recipient_user_id, recipient_address, recipient_name, subject, text_body, html_body,
                         unsubscribe_url, node_id, outage_id, dedupe_key, next_attempt_at, created_at, updated_at)
     VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $13)
     ON CONFLICT (dedupe_key) DO NOTHING RETURNING id`,
    {
      bind: [
        m.kind,
        m.userId,
        m.address,
        m.name?.replace(/[\r\n]+/g, ' ') ?? null,
        m.rendered.subject,
        m.rendered.text,
        m.rendered.html,
        m.unsubscribeUrl,
        m.nodeId ?? null,
        m.outageId ?? null,
        m.dedupeKey,
        m.notBefore ?? now,
        now,
      ],
      type: QueryTypes.SELECT,
      transaction,
    },
  );
  return rows.length > 0;
}
