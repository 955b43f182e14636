import type http from 'node:http';
import { createAdapter } from '@socket.io/postgres-adapter';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import type passport from 'passport';
import pg from 'pg';
import { Server } from 'socket.io';
import type { Config } from '../config';
import { isGenuineLink } from '../mail/signedLinks';
import { Node } from '../models';
import type { Actor } from '../policies/actor';
import { nodeRooms } from '../policies/node';
import { domainEvents, type AccessChangedEvent, type NodeFiguresEvent, type OutageTimelineEvent } from '../services/events';
import { recoveryContext } from '../services/hostRecovery';
import { admit, refreshRooms, sameOrigin } from './access';
import { type DatabaseWatch, guardPool } from '../db/availability';

/**
 * The adapter keeps its LISTEN connection checked out and, when that connection ends, takes a new
 * one without releasing the old: each database restart would leak a pool slot until publishing
 * starves. Connections taken with `await pool.connect()` are released when they end.
 */
export function releaseOnEnd(pool: pg.Pool): pg.Pool {
  const connect = pool.connect.bind(pool) as (cb?: unknown) => Promise<pg.PoolClient> | void;
  pool.connect = ((callback?: unknown) => {
    if (callback) return connect(callback); // pool.query's own path releases its clients itself
    return (connect() as Promise<pg.PoolClient>).then((client) => {
      let released = false;
      const release = client.release.bind(client);
      client.release = (err?: Error | boolean) => {
        if (released) return;
        released = true;
        release(err);
      };
      client.once('end', () => client.release(new Error('connection ended')));
      return client;
    });
  }) as typeof pool.connect;
  return pool;
}

/** The rooms of an event about a node (who may read it: policies/node.ts), plus the recovery pages open for it. */
const withRecovery = (e: { nodeId: number; neighbourhoodId: number; hostUserId: number | null }) => [...nodeRooms(e), `recovery:${e.nodeId}`];

type EngineMiddleware = (req: Request & { _query?: Record<string, string> }, res: Response, next: NextFunction) => void;
const onlyForHandshake =
  (mw: RequestHandler): EngineMiddleware =>
  (req, res, next) =>
    req._query?.sid === undefined ? (mw(req, res, next) as void) : next();

/** socket.io on the app's HTTP server, authenticated from the session cookie. */
export function createRealtime(server: http.Server, config: Config, session: RequestHandler, pp: typeof passport, watch?: DatabaseWatch) {
  const io = new Server(server, { serveClient: false, allowRequest: (req, answer) => answer(null, sameOrigin(req, config)) });
  let adapterPool: pg.Pool | null = null;
  if (config.socketAdapter === 'postgres') {
    // Fan-out across instances goes through PostgreSQL NOTIFY, so any instance can serve any browser.
    // Its LISTEN connection stays checked out: guardPool keeps a lost one from ending the process,
    // and the adapter itself re-listens on a new connection when the old one ends.
    // Two connections: the LISTEN one and one for NOTIFY, which keeps events in the order they happened.
    // Publishes wait in the pool's queue (in order) for the NOTIFY connection: under a burst (a whole town coming
    // online) that queue can take seconds, and an event that waited out the timeout would be lost to other instances.
    adapterPool = releaseOnEnd(
      guardPool(new pg.Pool({ connectionString: config.databaseUrl, max: 2, connectionTimeoutMillis: 30_000 }), 'live updates', watch),
    );
    // Its failed publishes are only logged: the watch follows the requests' own database calls.
    io.adapter(
      createAdapter(adapterPool, {
        tableName: 'socket_io_attachments',
        heartbeatInterval: 5_000,
        errorHandler: (err: Error) => console.error('live updates:', err.message),
      }),
    );
  }
  io.engine.use(onlyForHandshake(session));
  io.engine.use(onlyForHandshake(pp.initialize() as RequestHandler));
  io.engine.use(onlyForHandshake(pp.session() as RequestHandler));
  io.engine.use(
    onlyForHandshake((req, res, next) => {
      if (req.user) return next();
      // The host's recovery page has no session: its signed link admits it to one node's room.
      if (isGenuineLink(config.sessionSecret, (req as { _query?: Record<string, string> })._query?.recovery, 'recover', config.now())) return next();
      res.writeHead(401, { 'content-type': 'application/json' });
      res.end(JSON.stringify({ error: { code: 'not_signed_in', message: 'Sign in to receive live updates.' } }));
    }),
  );

  io.on('connection', (socket) => {
    const actor = (socket.request as Request).user as Actor | undefined;
    if (actor) admit(socket, config);
    const recovery = socket.handshake.query.recovery;
    if (typeof recovery === 'string') {
      // The host's recovery page: checked again in full (person active, still the host, outage recorded) before joining.
      recoveryContext(Node.sequelize!, config, recovery)
        .then((ctx) => socket.join(`recovery:${ctx.nodeId}`))
        .catch(() => socket.disconnect(true));
    } else if (!actor) {
      socket.disconnect(true);
    }
  });
  // Assignments, roles and deactivation take effect on open sockets at once, on every instance.
  const onAccess = (e: AccessChangedEvent) =>
    void refreshRooms(io, e.userIds).catch((err: Error) => console.error('could not refresh live-update rooms:', err.message));

  const onState = (e: Parameters<typeof nodeRooms>[0] & { nodeId: number }) => io.to(withRecovery(e)).emit('node:state', e);
  const onOutage = (e: Parameters<typeof nodeRooms>[0] & { nodeId: number }) => io.to(withRecovery(e)).emit('outage', e);
  const onTimeline = (e: OutageTimelineEvent) => io.to(withRecovery(e)).emit('outage:timeline', e);
  const figures = throttledFigures(config.figuresThrottleMs, (e) => io.to(withRecovery(e)).emit('node:figures', e));
  domainEvents.on('node-state', onState);
  domainEvents.on('outage', onOutage);
  domainEvents.on('outage-timeline', onTimeline);
  domainEvents.on('node-figures', figures.push);
  domainEvents.on('access-changed', onAccess);

  return {
    io,
    close: async () => {
      domainEvents.off('node-state', onState);
      domainEvents.off('outage', onOutage);
      domainEvents.off('outage-timeline', onTimeline);
      domainEvents.off('node-figures', figures.push);
      domainEvents.off('access-changed', onAccess);
      figures.stop();
      await new Promise<void>((resolve) => io.close(() => resolve()));
      await adapterPool?.end();
    },
  };
}

/** At most one figures push per node per window; the latest figures win. */
export function throttledFigures(windowMs: number, send: (e: NodeFiguresEvent) => void) {
  const lastSent = new Map<number, number>();
  const pending = new Map<number, { event: NodeFiguresEvent; timer: NodeJS.Timeout }>();
  const push = (e: NodeFiguresEvent) => {
    const now = Date.now();
    const since = now - (lastSent.get(e.nodeId) ?? 0);
    const queued = pending.get(e.nodeId);
    if (queued) {
      queued.event = e;
      return;
    }
    if (since >= windowMs) {
      lastSent.set(e.nodeId, now);
      send(e);
      return;
    }
    const timer = setTimeout(() => {
      const p = pending.get(e.nodeId)!;
      pending.delete(e.nodeId);
      lastSent.set(e.nodeId, Date.now());
      send(p.event);
    }, windowMs - since);
    pending.set(e.nodeId, { event: e, timer });
  };
  return { push, stop: () => pending.forEach((p) => clearTimeout(p.timer)) };
}
