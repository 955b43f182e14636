import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { idParamsSchema } from '../../shared/schemas/common';
import { seriesQuerySchema } from '../../shared/schemas/telemetry';
import type { Config } from '../config';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { presentNodeAvailability, presentNodeSeries } from '../presenters/telemetry';
import { nodeAvailabilityWindows, nodeSeries } from '../services/nodeTelemetry';
import { readableNode } from '../services/references';

/** Mounted at /nodes/:id: charts from the roll-ups, availability from the outages. */
export function nodeTelemetryRoutes(config: Config, sequelize: Sequelize) {
  const router = Router({ mergeParams: true });

  router.get('/series', validate('params', idParamsSchema), validate('query', seriesQuerySchema), async (req, res) => {
    const node = await readableNode(actorOf(req), res.locals.params.id);
    res.json({ data: presentNodeSeries(await nodeSeries(sequelize, node.id, res.locals.query.range, config.now())) });
  });

  router.get('/availability', validate('params', idParamsSchema), async (req, res) => {
    const node = await readableNode(actorOf(req), res.locals.params.id);
    res.json({ data: presentNodeAvailability(await nodeAvailabilityWindows(sequelize, node, config.now())) });
  });

  return router;
}
