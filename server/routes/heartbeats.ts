import express, { Router, type Request } from 'express';
import { rateLimit } from 'express-rate-limit';
import type { Sequelize } from 'sequelize';
import { heartbeatBatchSchema, heartbeatReportSchema } from '../../shared/schemas/heartbeat';
import type { Config } from '../config';
import { ApiError } from '../errors';
import { tooManyHandler } from '../middlewares/tooManyHandler';
import { parseOrThrow } from '../middlewares/validate';
import { configureGroupCommit, ingestReports } from '../services/heartbeatIngest';
import { setIngestCacheMs } from '../services/ingestCacheMs';
import { installIngestCacheHooks } from '../services/ingestCaches';
import { hashToken, nodeForToken } from '../services/ingestTokens';

const bearer = (req: Request) => /^Bearer\s+(\S+)$/i.exec(req.get('authorization') ?? '')?.[1] ?? null;
const badToken = () => new ApiError(401, 'bad_token', 'The node token is missing, wrong or revoked. Issue a new one from the node page.');

/** Nodes post reports here with their own bearer token; no session, no CSRF. */
export function heartbeatRoutes(config: Config, sequelize: Sequelize) {
  const router = Router();
  configureGroupCommit({ windowMs: config.ingestGroupWindowMs, maxReports: config.ingestGroupMaxReports });
  setIngestCacheMs(config.ingestCacheMs);
  installIngestCacheHooks();
  // Many nodes share one gateway address, so the limit is per token, never per address.
  const perToken = rateLimit({
    windowMs: 60_000,
    limit: config.ingestRateLimitPerMin,
    keyGenerator: (_req, res) => res.locals.tokenHash as string,
    validate: { keyGeneratorIpFallback: false },
    // A 429 says when to retry (Retry-After); the counters are not worth three headers on every accepted report.
    standardHeaders: false,
    legacyHeaders: false,
    handler: tooManyHandler(60_000, 'This node is sending too many reports. Slow down and retry after the wait.'),
  });

  router.post(
    '/',
    (req, res, next) => {
      const token = bearer(req);
      if (!token) return next(badToken());
      res.locals.token = token;
      res.locals.tokenHash = hashToken(token);
      next();
    },
    perToken,
    express.json({ limit: config.ingestBodyLimit }),
    async (req, res) => {
      const node = await nodeForToken(sequelize, res.locals.token as string, res.locals.tokenHash as string);
      if (!node) throw badToken();
      const body = req.body as unknown;
      const reports =
        body && typeof body === 'object' && 'reports' in body
          ? parseOrThrow(heartbeatBatchSchema, body, 'batch').reports
          : [parseOrThrow(heartbeatReportSchema, body, 'report')];
      const result = await ingestReports(sequelize, config, node, reports, config.now());
      res.status(202).json(result);
    },
  );
  return router;
}
