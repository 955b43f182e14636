import { randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import express, { type Request } from 'express';
import helmet from 'helmet';
import pg from 'pg';
import type { Sequelize } from 'sequelize';
import { configurePassport } from './auth/passport';
import { sessionMiddleware } from './auth/session';
import type { Config } from './config';
import { ApiError, NotFound } from './errors';
import { requireCsrf } from './middlewares/csrf';
import { errorHandler } from './middlewares/errorHandler';
import { requireUser } from './middlewares/requireUser';
import { initModels } from './models';
import { heartbeatRoutes } from './routes/heartbeats';
import { ingestTokenRoutes } from './routes/ingestTokens';
import { linkRoutes } from './routes/links';
import { neighbourhoodRoutes } from './routes/neighbourhoods';
import { nodeRoutes } from './routes/nodes';
import { nodeTelemetryRoutes } from './routes/nodeTelemetry';
import { outageRoutes } from './routes/outages';
import { overviewRoutes } from './routes/overview';
import { planningRoutes } from './routes/planning';
import { radioRoutes } from './routes/radios';
import { sessionRoutes } from './routes/session';
import { siteRoutes } from './routes/sites';
import { topologyRoutes } from './routes/topology';
import { userRoutes } from './routes/users';

export interface AppContext {
  config: Config;
  sequelize: Sequelize;
}

/** Signing in needs no CSRF token (API.md); node reports never reach this router. Paths are relative to /api/v1. */
const csrfExempt = (req: Request) => req.method === 'POST' && req.path === '/session';

export function createApp({ config, sequelize }: AppContext) {
  initModels(sequelize);
  const pool = new pg.Pool({ connectionString: config.databaseUrl, max: 4, connectionTimeoutMillis: 5_000 });
  pool.on('error', (err) => console.error('session pool error:', err.message));
  const passport = configurePassport();
  const session = sessionMiddleware(config, pool);
  const app = express();
  app.set('trust proxy', config.trustProxy);
  app.disable('x-powered-by');

  app.use((req, res, next) => {
    res.locals.requestId = req.get('x-request-id') ?? randomUUID();
    res.set('X-Request-Id', res.locals.requestId);
    if (config.logRequests) res.on('finish', () => console.log(`[${res.locals.requestId}] ${req.method} ${req.originalUrl} ${res.statusCode}`));
    next();
  });
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          styleSrc: ["'self'", "'unsafe-inline'"], // the topology graph positions nodes with inline styles
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'", 'ws:', 'wss:'],
          upgradeInsecureRequests: config.cookieSecure ? [] : null,
        },
      },
      hsts: config.cookieSecure,
    }),
  );

  app.get('/api/health', async (_req, res) => {
    try {
      await sequelize.query('SELECT 1');
      res.json({ status: 'ok' });
    } catch {
      res.set('Retry-After', '5').status(503).json({ status: 'unavailable', error: { code: 'database_unavailable', message: 'The database is not answering.' } });
    }
  });

  // Hot path first: node reports skip sessions entirely.
  app.use('/api/v1/heartbeats', heartbeatRoutes(config, sequelize));

  const api = express.Router();
  api.use(express.json({ limit: '64kb' }));
  api.use(session);
  api.use(passport.initialize());
  api.use(passport.session());
  api.use(requireCsrf(csrfExempt));
  api.use('/session', sessionRoutes(config, passport));
  api.use('/neighbourhoods', requireUser, neighbourhoodRoutes());
  api.use('/sites', requireUser, siteRoutes());
  api.use('/nodes/:id/ingest-token', requireUser, ingestTokenRoutes(config, sequelize));
  api.use('/nodes/:id', requireUser, nodeTelemetryRoutes(config, sequelize));
  api.use('/nodes', requireUser, nodeRoutes());
  api.use('/outages', requireUser, outageRoutes(config));
  api.use('/topology', requireUser, topologyRoutes(sequelize));
  api.use('/radios', requireUser, radioRoutes());
  api.use('/links', requireUser, linkRoutes());
  api.use('/users', requireUser, userRoutes());
  api.use('/overview', requireUser, overviewRoutes());
  api.use('/planning', requireUser, planningRoutes());
  api.use((req, _res, next) => next(new ApiError(404, 'no_such_route', `There is no ${req.method} ${req.baseUrl}${req.path} in the API.`)));
  app.use('/api/v1', api);
  app.use('/api', (req, _res, next) => next(NotFound(`The API address ${req.originalUrl}`)));

  const dist = path.resolve(config.clientDist);
  if (fs.existsSync(path.join(dist, 'index.html'))) {
    app.use(express.static(dist, { index: false, maxAge: '1h' }));
    app.get('/{*splat}', (_req, res) => res.sendFile(path.join(dist, 'index.html')));
  }

  app.use(errorHandler);
  return { app, session, passport, pool, close: () => pool.end() };
}
