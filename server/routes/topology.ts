import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import type { Config } from '../config';
import { actorOf } from '../middlewares/requireUser';
import { presentTopology } from '../presenters/topology';
import { topologyFor } from '../services/topologyView';

/** The map's graph, scoped to the nodes the caller may read (policies/node.ts). */
export function topologyRoutes(config: Config, sequelize: Sequelize) {
  const router = Router();
  router.get('/', async (req, res) => {
    const actor = actorOf(req);
    res.json({ data: presentTopology(actor, await topologyFor(config, sequelize, actor)) });
  });
  return router;
}
