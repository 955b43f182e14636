import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import type { Config } from '../config';
import { computePublicStatus, sharedFor } from '../services/publicStatus';

/** Mounted at /api/v1/public before the session middleware: no sign-in, no cookie, no CSRF. */
export function publicStatusRoutes(config: Config, sequelize: Sequelize) {
  const router = Router();
  const current = sharedFor(config.publicStatusCacheS * 1000, config.now, () => computePublicStatus(sequelize, config.now()));

  router.get('/status', async (_req, res) => {
    const status = await current();
    res.set('Cache-Control', `public, max-age=${config.publicStatusCacheS}`);
    res.json({ data: status });
  });

  return router;
}
