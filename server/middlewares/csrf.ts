import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { NextFunction, Request, Response } from 'express';
import { ApiError } from '../errors';

declare module 'express-session' {
  interface SessionData {
    csrfToken?: string;
  }
}

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/** The session's CSRF token, created on first need. */
export function csrfTokenFor(req: Request): string {
  req.session.csrfToken ??= randomBytes(24).toString('base64url');
  return req.session.csrfToken;
}

function matches(expected: string | undefined, given: string | undefined): boolean {
  if (!expected || !given) return false;
  const a = Buffer.from(expected);
  const b = Buffer.from(given);
  return a.length === b.length && timingSafeEqual(a, b);
}

/** A signed-in browser's mutating request must echo the session's token in X-CSRF-Token. */
export function requireCsrf(exempt: (req: Request) => boolean) {
  return (req: Request, _res: Response, next: NextFunction) => {
    if (SAFE.has(req.method) || exempt(req) || !req.user) return next();
    if (!matches(req.session?.csrfToken, req.get('x-csrf-token'))) {
      return next(new ApiError(403, 'csrf_failed', 'This request is missing its security token. Reload the page and try again.'));
    }
    next();
  };
}
