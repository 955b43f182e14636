import { randomUUID } from 'node:crypto';
import compression from 'compression';
import express, { type Request } from 'express';
import helmet from 'helmet';
import pg from 'pg';
import { ConnectionAcquireTimeoutError, type Sequelize } from 'sequelize';
import { configurePassport } from './auth/passport';
import { sessionMiddleware } from './auth/session';
import type { Config } from './config';
import { DatabaseWatch, guardPool, isDatabaseError } from './db/availability';
import { ApiError, NotFound, Unavailable } from './errors';
import { requireCsrf } from './middlewares/csrf';
import { errorHandler } from './middlewares/errorHandler';
import { requireRole } from './middlewares/requireRole';
import { requireUser } from './middlewares/requireUser';
import { initModels } from './models';
import { heartbeatRoutes } from './routes/heartbeats';
import { addressPlanRoutes } from './routes/addressPlans';
import { channelPlanRoutes } from './routes/channelPlan';
import { linkHealthRoutes } from './routes/linkHealth';
import { plannedLinkRoutes } from './routes/plannedLinks';
import { provisioningRoutes } from './routes/provisioning';
import { securityReviewRoutes } from './routes/securityReview';
import { settingsRoutes } from './routes/settings';
import { siteSurveyRoutes } from './routes/siteSurveys';
import { ingestTokenRoutes } from './routes/ingestTokens';
import { linkRoutes } from './routes/links';
import { mailInboxRoutes } from './routes/mailInbox';
import { mailLinkRoutes } from './routes/mailLinks';
import { maintenanceWindowRoutes } from './routes/maintenanceWindows';
import { neighbourhoodRoutes } from './routes/neighbourhoods';
import { nodeRoutes } from './routes/nodes';
import { nodeTelemetryRoutes } from './routes/nodeTelemetry';
import { outageRoutes } from './routes/outages';
import { outboxRoutes } from './routes/outbox';
import { overviewRoutes } from './routes/overview';
import { planningRoutes } from './routes/planning';
import { terrainRoutes } from './routes/terrain';
import { preferenceRoutes } from './routes/preferences';
import { radioRoutes } from './routes/radios';
import { sessionRoutes } from './routes/session';
import { siteRoutes } from './routes/sites';
import { topologyRoutes } from './routes/topology';
import { userRoutes } from './routes/users';
import { exportRoutes } from './routes/exports';
import { importRoutes } from './routes/imports';
import { photoRoutes, sitePhotoRoutes } from './routes/photos';
import { publicStatusRoutes } from './routes/publicStatus';
import { recoveryRoutes } from './routes/recovery';
import { reportRoutes } from './routes/reports';
import { historyRoutes } from './routes/history';
import { hostPortalRoutes } from './routes/hostPortal';
import { invitationRoutes } from './routes/invitations';
import { meRoutes } from './routes/me';
import { neighbourhoodMemberRoutes } from './routes/neighbourhoodMembers';
import { passwordResetRoutes } from './routes/passwordResets';
import { personalDataRoutes } from './routes/personalData';
import { auditContext, installAuditHooks } from './services/audit';
import { mayPlan } from './policies/planning';
import { staticClient } from './staticClient';

export interface AppContext {
  config: Config;
  sequelize: Sequelize;
  /** Shared with the jobs and socket.io in a running process; one of its own otherwise. */
  databaseWatch?: DatabaseWatch;
}

/** Request ids from a proxy or client: letters, digits and . _ : - only, at most 64 (a UUID fits). */
export const SAFE_REQUEST_ID = /^[A-Za-z0-9][A-Za-z0-9._:-]{0,63}$/;

/** What helmet would say that matters for a JSON answer to a machine (the hot path skips helmet). */
const apiHeaders: express.RequestHandler = (_req, res, next) => {
  res.set({ 'X-Content-Type-Options': 'nosniff', 'Cache-Control': 'no-store' });
  next();
};

const retryAfterS = (config: Config) => Math.max(1, Math.ceil(config.databaseProbeIntervalMs / 1000) * 2);

/** Signing in needs no CSRF token (API.md); node reports never reach this router. Paths are relative to /api/v1. */
const csrfExempt = (req: Request) => req.method === 'POST' && req.path === '/session';

export function createApp({ config, sequelize, databaseWatch }: AppContext) {
  initModels(sequelize);
  installAuditHooks();
  const watch = databaseWatch ?? new DatabaseWatch(() => sequelize.query('SELECT 1'), config.databaseProbeIntervalMs);
  const pool = guardPool(new pg.Pool({ connectionString: config.databaseUrl, max: 4, connectionTimeoutMillis: 5_000 }), 'session store', watch);
  const passport = configurePassport();
  const session = sessionMiddleware(config, pool);
  // While the database is known to be away, every API call is answered 503 at once (no waiting on
  // connection timeouts); the watch's probe lets traffic through again as soon as it answers.
  const databaseUp: express.RequestHandler = (_req, _res, next) => next(watch.up ? undefined : Unavailable(undefined, retryAfterS(config)));
  const app = express();
  app.set('trust proxy', config.trustProxy);
  app.disable('x-powered-by');

  app.use((req, res, next) => {
    // A caller's id is kept only when it is short and plain, so nothing odd reaches the logs.
    const given = req.get('x-request-id');
    res.locals.requestId = given && SAFE_REQUEST_ID.test(given) ? given : randomUUID();
    res.set('X-Request-Id', res.locals.requestId);
    if (config.logRequests) res.on('finish', () => console.log(`[${res.locals.requestId}] ${req.method} ${req.originalUrl} ${res.statusCode}`));
    next();
  });
  // Hot path first: node reports are machines posting a few hundred bytes many times a second, so they
  // skip the page headers, compression (their answers are a few bytes), sessions and every other route.
  app.use('/api/v1/heartbeats', apiHeaders, databaseUp, heartbeatRoutes(config, sequelize));

  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          defaultSrc: ["'self'"],
          styleSrc: ["'self'", "'unsafe-inline'"], // the topology graph positions nodes with inline styles
          imgSrc: ["'self'", 'data:', 'blob:'],
          fontSrc: ["'self'", 'data:'],
          connectSrc: ["'self'"], // CSP Level 3: 'self' covers ws: and wss: to this same host, and nothing else
          upgradeInsecureRequests: config.cookieSecure ? [] : null,
        },
      },
      hsts: config.cookieSecure,
    }),
  );

  // Every text answer (pages, scripts, styles, JSON) compressed for phones on weak mobile data; brotli when offered.
  app.use(compression());

  app.get('/api/health', async (_req, res) => {
    try {
      await sequelize.query('SELECT 1');
      res.json({ status: 'ok' });
    } catch (err) {
      watch.reportFailure(err);
      res
        .set('Retry-After', String(retryAfterS(config)))
        .status(503)
        .json({
          status: 'unavailable',
          error: { code: 'database_unavailable', message: 'Parapet cannot reach its database. It retries by itself; try again in a few seconds.' },
        });
    }
  });

  app.use('/api', databaseUp);

  // Links in mail carry their own signature and need no session (nor its CSRF token).
  app.use('/api/v1/mail-links', mailLinkRoutes(config));
  // The host's recovery page works from the signed link in the outage mail, without signing in.
  app.use('/api/v1/recovery', recoveryRoutes(config, sequelize));
  // The public status page needs no session; it is computed once per cache period for everyone.
  app.use('/api/v1/public', publicStatusRoutes(config, sequelize));

  const api = express.Router();
  // Answers may carry personal data and tokens: no browser or proxy cache keeps them.
  api.use((_req, res, next) => {
    res.set('Cache-Control', 'no-store');
    next();
  });
  api.use(express.json({ limit: '64kb' }));
  api.use(session);
  api.use(passport.initialize());
  api.use(passport.session());
  api.use(requireCsrf(csrfExempt));
  api.use(auditContext);
  api.use('/session', sessionRoutes(config, passport));
  // Accepting an invitation and resetting a password work signed out: the link in the mail is the proof.
  api.use('/invitations', invitationRoutes(config, sequelize));
  api.use('/password-resets', passwordResetRoutes(config, sequelize));
  api.use('/history', requireUser, historyRoutes(sequelize));
  api.use('/neighbourhoods/:id', requireUser, neighbourhoodMemberRoutes(config, sequelize));
  api.use('/neighbourhoods', requireUser, neighbourhoodRoutes());
  api.use('/sites/:id/photos', requireUser, sitePhotoRoutes(sequelize, config));
  api.use('/sites', requireUser, siteRoutes());
  api.use('/photos', requireUser, photoRoutes(sequelize, config));
  api.use('/imports', requireUser, importRoutes(sequelize, config));
  api.use('/exports', requireUser, exportRoutes(sequelize));
  api.use('/reports', requireUser, reportRoutes(config, sequelize));
  api.use('/nodes/:id/ingest-token', requireUser, ingestTokenRoutes(config, sequelize));
  api.use('/nodes/:id/site-surveys', requireUser, siteSurveyRoutes(sequelize));
  api.use('/nodes/:id/provisioning', requireUser, provisioningRoutes(sequelize));
  api.use('/nodes/:id/maintenance-windows', requireUser, maintenanceWindowRoutes(config, sequelize));
  api.use('/nodes/:id', requireUser, nodeTelemetryRoutes(config, sequelize));
  api.use('/nodes', requireUser, nodeRoutes());
  api.use('/outages', requireUser, outageRoutes(config, sequelize));
  api.use('/outbox', requireUser, outboxRoutes(config));
  api.use('/me/preferences', requireUser, preferenceRoutes());
  api.use('/me/nodes', requireUser, hostPortalRoutes(config, sequelize));
  api.use('/me', requireUser, meRoutes(sequelize, config));
  api.use('/mail-inbox', requireUser, mailInboxRoutes(config));
  api.use('/topology', requireUser, topologyRoutes(config, sequelize));
  api.use('/radios', requireUser, radioRoutes());
  api.use('/links/:id/health', requireUser, linkHealthRoutes(config, sequelize));
  api.use('/links', requireUser, linkRoutes());
  api.use('/users/:id', requireUser, personalDataRoutes(config, sequelize));
  api.use('/users', requireUser, userRoutes(config));
  api.use('/overview', requireUser, overviewRoutes(config));
  // Planning is for operators and admins: others hear 403 before anything about their input.
  api.use('/planning', requireUser, requireRole(mayPlan, 'Planning is for operators and admins.'));
  api.use('/planning/planned-links', requireUser, plannedLinkRoutes(sequelize));
  api.use('/planning/channel-plan', requireUser, channelPlanRoutes(sequelize));
  api.use('/planning', requireUser, planningRoutes(sequelize));
  api.use('/terrain', requireUser, terrainRoutes(sequelize));
  api.use('/address-plans', requireUser, addressPlanRoutes(sequelize));
  api.use('/security-review', requireUser, securityReviewRoutes(sequelize));
  api.use('/settings', requireUser, settingsRoutes(sequelize));
  api.use((req, _res, next) => next(new ApiError(404, 'no_such_route', `There is no ${req.method} ${req.baseUrl}${req.path} in the API.`)));
  app.use('/api/v1', api);
  app.use('/api', (req, _res, next) => next(NotFound(`The API address ${req.originalUrl}`)));

  app.use(staticClient(config.clientDist));

  // A database call that failed because the server went away is the outage, not the request's fault.
  app.use((err: unknown, _req: Request, _res: express.Response, next: express.NextFunction) => {
    if (watch.reportFailure(err) || (!watch.up && isDatabaseError(err))) return next(Unavailable(undefined, retryAfterS(config)));
    // Every pooled connection stayed busy too long: busy, not down; the client tries again shortly.
    if (err instanceof ConnectionAcquireTimeoutError) return next(Unavailable(undefined, retryAfterS(config)));
    next(err);
  });
  app.use(errorHandler);
  return {
    app,
    session,
    passport,
    pool,
    databaseWatch: watch,
    close: async () => {
      if (!databaseWatch) watch.stop();
      await pool.end();
    },
  };
}
