import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import type { Config } from '../config';
import { actorOf } from '../middlewares/requireUser';
import { presentNeighbourhoodStates, presentTopology } from '../presenters/topology';
import { neighbourhoodStates, topologyFor } from '../services/topologyView';

/** The map's graph, scoped to the nodes the caller may read (policies/node.ts). */
export function topologyRoutes(config: Config, sequelize: Sequelize) {
  const router = Router();
  // Small and quick: the map draws its neighbourhood marks from this while the whole graph loads.
  router.get('/neighbourhoods', async (req, res) => {
    res.json({ data: presentNeighbourhoodStates(await neighbourhoodStates(sequelize, actorOf(req))) });
  });
  router.get('/', async (req, res) => {
    const actor = actorOf(req);
    res.json({ data: presentTopology(actor, await topologyFor(config, sequelize, actor)) });
  });
  return router;
}
