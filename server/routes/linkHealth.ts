import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { idParamsSchema } from '../../shared/schemas/common';
import type { Config } from '../config';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { linkHealth } from '../services/linkHealth';

/** GET /links/:id/health: measured signal beside prediction and the link's own 7-day baseline. */
export function linkHealthRoutes(config: Config, sequelize: Sequelize) {
  const router = Router({ mergeParams: true });
  router.get('/', validate('params', idParamsSchema), async (req, res) => {
    res.json({ data: await linkHealth(sequelize, actorOf(req), res.locals.params.id, config.now()) });
  });
  return router;
}
