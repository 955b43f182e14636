import { createHmac, hkdfSync, timingSafeEqual } from 'node:crypto';
import type { Request, Response } from 'express';
import type { Config } from '../config';

// A browser that signed in to an account before carries this signed cookie, so strangers who run up
// the account's failed sign-ins cannot lock its owner out (OWASP Authentication Cheat Sheet, "device cookies").
const NAME = 'parapet.known';
const PATH = '/api/v1/session';

// A key of its own, derived from the session secret (RFC 5869), signing e-mail and expiry (RFC 2104).
const keyFor = (secret: string) => Buffer.from(hkdfSync('sha256', secret, 'parapet-known-device', 'known-device-v1', 32));
const mac = (secret: string, email: string, expiresAtS: number) => createHmac('sha256', keyFor(secret)).update(`${email}|${expiresAtS}`).digest('base64url');

/** After a successful sign-in: remember this browser for the account. */
export function rememberDevice(res: Response, config: Config, email: string) {
  const expiresAtS = Math.floor((config.now().getTime() + config.knownDeviceMs) / 1000);
  res.cookie(NAME, `${expiresAtS}.${mac(config.sessionSecret, email, expiresAtS)}`, {
    httpOnly: true,
    sameSite: 'lax',
    secure: config.cookieSecure,
    path: PATH,
    maxAge: config.knownDeviceMs,
  });
}

function cookieValue(req: Request): string | null {
  for (const part of (req.headers.cookie ?? '').split(';')) {
    const eq = part.indexOf('=');
    if (eq > 0 && part.slice(0, eq).trim() === NAME) return decodeURIComponent(part.slice(eq + 1).trim());
  }
  return null;
}

/** Whether this browser signed in to the account (e-mail, lower case) before, within the cookie's lifetime. */
export function isKnownDevice(req: Request, config: Config, email: string): boolean {
  const m = /^(\d{1,12})\.([A-Za-z0-9_-]{43})$/.exec(cookieValue(req) ?? '');
  if (!m) return false;
  const expiresAtS = Number(m[1]);
  if (expiresAtS * 1000 <= config.now().getTime()) return false;
  return timingSafeEqual(Buffer.from(m[2]), Buffer.from(mac(config.sessionSecret, email, expiresAtS)));
}
