import express, { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { recoveryStepSchema } from '../../shared/schemas/recovery';
import type { Config } from '../config';
import { Conflict } from '../errors';
import { validate } from '../middlewares/validate';
import { Site } from '../models';
import { recoveryContext, recoveryView } from '../services/hostRecovery';
import { recordHostStep } from '../services/outageTimeline';

/**
 * The host's recovery page, opened from the outage mail without a password: the signed link is a
 * short-lived capability for one outage and one person (like the acknowledge link), so no session
 * and no CSRF token; the token travels in the query (GET) or the body (POST), never in a cookie.
 */
export function recoveryRoutes(config: Config, sequelize: Sequelize) {
  const router = Router();
  router.use(express.json({ limit: '4kb' }));
  router.use((_req, res, next) => {
    res.set({ 'Cache-Control': 'no-store', 'Referrer-Policy': 'no-referrer' });
    next();
  });

  router.get('/', async (req, res) => {
    const ctx = await recoveryContext(sequelize, config, req.query.t);
    res.json({ data: await recoveryView(sequelize, config, ctx) });
  });

  router.post('/host-steps', validate('body', recoveryStepSchema), async (req, res) => {
    const { t, ...step } = res.locals.body;
    const ctx = await recoveryContext(sequelize, config, t);
    if (ctx.upstreamNodeId !== null && ctx.nodeId !== ctx.outage.nodeId) {
      throw Conflict('Nothing is needed at your place: the problem is further up the network, and the operators are on it.');
    }
    const hostUserId = (await Site.findByPk(ctx.outage.node!.siteId, { attributes: ['hostUserId'] }))?.hostUserId ?? null;
    const entry = await recordHostStep(sequelize, ctx.outage, ctx.actor, step, hostUserId, config.now());
    res.status(201).json({ data: entry });
  });
  return router;
}
