import connectPgSimple from 'connect-pg-simple';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import session from 'express-session';
import type pg from 'pg';
import type { Config } from '../config';

declare module 'express-session' {
  interface SessionData {
    /** When the person signed in (ms since the epoch); the session ends sessionAbsoluteMs later. */
    signedInAt?: number;
    passport?: { user?: unknown };
  }
}

/** Stamps the sign-in time; call right after req.login, which starts a fresh session. */
export function markSignedIn(req: Request, config: Config) {
  req.session.signedInAt = config.now().getTime();
}

/** Whether a signed-in session has outlived its absolute lifetime. */
export const sessionExpired = (s: { signedInAt?: number } | undefined, config: Config) =>
  s?.signedInAt !== undefined && config.now().getTime() - s.signedInAt >= config.sessionAbsoluteMs;

/** The session cookie's name (server/staticClient.ts looks for it to preload a page's data). */
export const SESSION_COOKIE = 'parapet.sid';

/** Sessions live in PostgreSQL so any instance can serve any request. */
export function sessionMiddleware(config: Config, pool: pg.Pool): RequestHandler {
  const PgStore = connectPgSimple(session);
  const base = session({
    name: SESSION_COOKIE,
    store: new PgStore({ pool, tableName: 'session', createTableIfMissing: false, pruneSessionInterval: 15 * 60 }),
    secret: config.sessionSecret,
    resave: false,
    saveUninitialized: false,
    rolling: true, // idle timeout: every request pushes the expiry forward
    proxy: config.trustProxy !== false,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: config.cookieSecure,
      maxAge: config.sessionIdleMs,
    },
  });
  // The idle timeout alone lets a busy session live for ever; this one ends it a fixed time after sign-in.
  const absolute = (req: Request, _res: Response, next: NextFunction) => {
    const s = req.session;
    if (!s?.passport?.user) return next();
    if (s.signedInAt === undefined) {
      s.signedInAt = config.now().getTime(); // sessions from before the limit existed start counting now
      return next();
    }
    if (!sessionExpired(s, config)) return next();
    // A fresh, empty session: the stored one is deleted and the caller is signed out.
    s.regenerate((err) => next(err));
  };
  return (req, res, next) => base(req, res, (err?: unknown) => (err ? next(err) : absolute(req, res, next)));
}
