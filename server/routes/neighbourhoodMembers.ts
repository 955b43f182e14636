import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { idParamsSchema } from '../../shared/schemas/common';
import { neighbourhoodNodesSchema } from '../../shared/schemas/neighbourhood';
import type { Config } from '../config';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { authorize } from '../policies/authorize';
import { neighbourhoodAbilities } from '../policies/neighbourhood';
import { presentNeighbourhoodSummary } from '../presenters/neighbourhood';
import { moveNodesInto, neighbourhoodSummary } from '../services/neighbourhoods';
import { readableNeighbourhood } from '../services/references';

/** Mounted at /neighbourhoods/:id: what is in a neighbourhood, and moving nodes into it in bulk. */
export function neighbourhoodMemberRoutes(config: Config, sequelize: Sequelize) {
  const router = Router({ mergeParams: true });

  router.get('/summary', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const n = await readableNeighbourhood(actor, res.locals.params.id);
    res.json({ data: presentNeighbourhoodSummary(await neighbourhoodSummary(config, sequelize, actor, n)) });
  });

  router.post('/nodes', validate('params', idParamsSchema), validate('body', neighbourhoodNodesSchema), async (req, res) => {
    const actor = actorOf(req);
    const n = await readableNeighbourhood(actor, res.locals.params.id);
    authorize(neighbourhoodAbilities(actor, n).update, 'Only admins move nodes between neighbourhoods.');
    const { moved, unchanged } = await moveNodesInto(sequelize, n, res.locals.body.nodeIds);
    res.json({ data: { neighbourhoodId: n.id, moved, unchanged } });
  });

  return router;
}
