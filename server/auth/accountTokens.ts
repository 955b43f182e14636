import { createHmac, hkdfSync, timingSafeEqual } from 'node:crypto';
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { ApiError } from '../errors';

export type AccountTokenPurpose = 'invitation' | 'password-reset';

const TOKEN = /^(invitation|password-reset)\.(\d{1,15})\.(\d{1,10})\.(\d{1,12})\.([A-Za-z0-9_-]{43})$/;

// A key of its own, derived from the session secret, so these links never share a key with sessions or mail links (RFC 5869).
const keyFor = (secret: string) => Buffer.from(hkdfSync('sha256', secret, 'parapet-account-links', 'account-link-v1', 32));
// HMAC-SHA256 (RFC 2104) over every claim; changing any of them breaks the signature.
const mac = (secret: string, purpose: string, id: number, userId: number, expiresAtS: number) =>
  createHmac('sha256', keyFor(secret)).update(`${purpose}|${id}|${userId}|${expiresAtS}`).digest('base64url');

/**
 * Writes a new link row (spending any earlier unused link of the same person and purpose, so only the
 * newest mail works) and answers the signed token for it.
 */
export async function issueAccountToken(
  sequelize: Sequelize,
  secret: string,
  t: { purpose: AccountTokenPurpose; userId: number; now: Date; ttlMs: number },
  transaction: Transaction,
): Promise<{ id: number; token: string; expiresAt: Date }> {
  await sequelize.query(`UPDATE account_tokens SET used_at = $3 WHERE user_id = $1 AND purpose = $2 AND used_at IS NULL`, {
    bind: [t.userId, t.purpose, t.now],
    transaction,
  });
  const expiresAtS = Math.floor((t.now.getTime() + t.ttlMs) / 1000);
  const [row] = await sequelize.query<{ id: string }>(
    `INSERT INTO account_tokens (purpose, user_id, expires_at, created_at) VALUES ($1, $2, to_timestamp($3), $4) RETURNING id`,
    { bind: [t.purpose, t.userId, expiresAtS, t.now], type: QueryTypes.SELECT, transaction },
  );
  const id = Number(row.id);
  return {
    id,
    token: `${t.purpose}.${id}.${t.userId}.${expiresAtS}.${mac(secret, t.purpose, id, t.userId, expiresAtS)}`,
    expiresAt: new Date(expiresAtS * 1000),
  };
}

const damaged = () =>
  new ApiError(400, 'bad_link', 'This link is damaged or was changed, so Parapet cannot trust it. Copy the whole link from the e-mail, or ask for a new one.');

/**
 * Spends a genuine, unexpired, unused link inside the caller's transaction and answers whose it is.
 * Tampered → 400, expired → 410 link_expired, already used or replaced → 410 link_used.
 */
export async function spendAccountToken(
  sequelize: Sequelize,
  secret: string,
  token: string,
  purpose: AccountTokenPurpose,
  now: Date,
  transaction: Transaction,
): Promise<{ userId: number }> {
  const m = TOKEN.exec(token);
  if (!m) throw damaged();
  const [, p, idText, userIdText, expText, given] = m;
  const id = Number(idText);
  const userId = Number(userIdText);
  const expiresAtS = Number(expText);
  const expected = Buffer.from(mac(secret, p, id, userId, expiresAtS));
  if (!timingSafeEqual(Buffer.from(given), expected) || p !== purpose) throw damaged();
  const what = purpose === 'invitation' ? 'invitation' : 'password-reset link';
  const again = purpose === 'invitation' ? 'Ask an admin to invite you again.' : 'Ask for a new one from the sign-in page.';
  if (expiresAtS * 1000 <= now.getTime()) throw new ApiError(410, 'link_expired', `This ${what} has expired. ${again}`);
  // Row lock: two tabs submitting the same link at once spend it once.
  const [row] = await sequelize.query<{ used_at: Date | null }>(
    `SELECT used_at FROM account_tokens WHERE id = $1 AND user_id = $2 AND purpose = $3 FOR UPDATE`,
    { bind: [id, userId, purpose], type: QueryTypes.SELECT, transaction },
  );
  if (!row) throw damaged();
  if (row.used_at) throw new ApiError(410, 'link_used', `This ${what} was already used or replaced by a newer one. ${again}`);
  await sequelize.query(`UPDATE account_tokens SET used_at = $2 WHERE id = $1`, { bind: [id, now], transaction });
  return { userId };
}

/** Ends every stored session of a person (all but `keepSid`), e.g. after their password changed. */
export async function endSessionsOf(sequelize: Sequelize, userId: number, keepSid?: string, transaction?: Transaction) {
  await sequelize.query(`DELETE FROM session WHERE (sess -> 'passport' ->> 'user') = $1 AND ($2::text IS NULL OR sid <> $2)`, {
    bind: [String(userId), keepSid ?? null],
    transaction,
  });
}
