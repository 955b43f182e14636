import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { idParamsSchema } from '../../shared/schemas/common';
import type { Config } from '../config';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { authorize } from '../policies/authorize';
import { nodeAbilities } from '../policies/node';
import { revokeTokens, rotateToken } from '../services/ingestTokens';
import { readableNode } from '../services/references';

/** Mounted at /nodes/:id/ingest-token. The token is shown once; only its hash is kept. */
export function ingestTokenRoutes(config: Config, sequelize: Sequelize) {
  const router = Router({ mergeParams: true });

  router.post('/', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const node = await readableNode(actor, res.locals.params.id);
    authorize(nodeAbilities(actor, node).update, 'Only admins and the operators of its neighbourhood issue node tokens.');
    const token = await rotateToken(sequelize, node.id, config.now());
    res.status(201).set('Cache-Control', 'no-store').json({ token });
  });

  router.delete('/', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const node = await readableNode(actor, res.locals.params.id);
    authorize(nodeAbilities(actor, node).update, 'Only admins and the operators of its neighbourhood revoke node tokens.');
    await revokeTokens(sequelize, node.id, config.now());
    res.status(204).end();
  });

  return router;
}
