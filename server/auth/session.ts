import connectPgSimple from 'connect-pg-simple';
import session from 'express-session';
import type pg from 'pg';
import type { Config } from '../config';

/** Sessions live in PostgreSQL so any instance can serve any request. */
export function sessionMiddleware(config: Config, pool: pg.Pool) {
  const PgStore = connectPgSimple(session);
  return session({
    name: 'parapet.sid',
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
}
