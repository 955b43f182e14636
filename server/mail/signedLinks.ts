import { createHmac, hkdfSync, timingSafeEqual } from 'node:crypto';
import { ApiError } from '../errors';

export type LinkPurpose = 'acknowledge' | 'preferences' | 'unsubscribe' | 'recover';
export interface LinkClaims {
  purpose: LinkPurpose;
  userId: number;
  /** The outage an acknowledge or recover link is for; 0 when the purpose needs none. */
  outageId: number;
  expiresAtS: number;
}

const PURPOSES: readonly LinkPurpose[] = ['acknowledge', 'preferences', 'unsubscribe', 'recover'];
const TOKEN = /^(acknowledge|preferences|unsubscribe|recover)\.(\d{1,10})\.(\d{1,10})\.(\d{1,12})\.([A-Za-z0-9_-]{43})$/;

// A key of its own, derived from the session secret, so a leaked link key never signs sessions (RFC 5869).
const keyFor = (secret: string) => Buffer.from(hkdfSync('sha256', secret, 'parapet-mail-links', 'signed-link-v1', 32));

// HMAC-SHA256 (RFC 2104) over purpose, ids and expiry; any change to them breaks the signature.
const mac = (secret: string, c: LinkClaims) =>
  createHmac('sha256', keyFor(secret)).update(`${c.purpose}|${c.userId}|${c.outageId}|${c.expiresAtS}`).digest('base64url');

export function signLink(secret: string, c: LinkClaims): string {
  return `${c.purpose}.${c.userId}.${c.outageId}.${c.expiresAtS}.${mac(secret, c)}`;
}

/** The claims of a genuine, unexpired link for `purpose`; otherwise 400 (tampered) or 410 (expired). */
export function verifyLink(secret: string, token: unknown, purpose: LinkPurpose, now: Date): LinkClaims {
  const m = typeof token === 'string' ? TOKEN.exec(token) : null;
  if (!m || !PURPOSES.includes(m[1] as LinkPurpose)) throw badLink();
  const claims: LinkClaims = { purpose: m[1] as LinkPurpose, userId: Number(m[2]), outageId: Number(m[3]), expiresAtS: Number(m[4]) };
  const given = Buffer.from(m[5]);
  const expected = Buffer.from(mac(secret, claims));
  if (given.length !== expected.length || !timingSafeEqual(given, expected) || claims.purpose !== purpose) throw badLink();
  if (claims.expiresAtS * 1000 <= now.getTime()) {
    throw new ApiError(410, 'link_expired', 'This link from your e-mail has expired. Sign in to Parapet to do this, or use the link in a newer message.');
  }
  return claims;
}

const badLink = () =>
  new ApiError(
    400,
    'bad_link',
    'This link is damaged or was changed, so Parapet cannot trust it. Copy the whole link from the e-mail, or sign in to Parapet instead.',
  );

/** Whether `token` is a genuine, unexpired link for `purpose` (for checks that answer yes or no, like a socket handshake). */
export function isGenuineLink(secret: string, token: unknown, purpose: LinkPurpose, now: Date): boolean {
  const m = typeof token === 'string' ? TOKEN.exec(token) : null;
  if (!m || m[1] !== purpose) return false;
  const claims: LinkClaims = { purpose, userId: Number(m[2]), outageId: Number(m[3]), expiresAtS: Number(m[4]) };
  const given = Buffer.from(m[5]);
  const expected = Buffer.from(mac(secret, claims));
  return given.length === expected.length && timingSafeEqual(given, expected) && claims.expiresAtS * 1000 > now.getTime();
}
