import { Router } from 'express';
import { Op } from 'sequelize';
import { idParamsSchema } from '../../shared/schemas/common';
import {
  neighbourhoodCreateSchema,
  neighbourhoodListQuerySchema,
  neighbourhoodUpdateSchema,
  operatorAssignmentSchema,
} from '../../shared/schemas/neighbourhood';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { Neighbourhood } from '../models';
import type { Actor } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { mayCreateNeighbourhood, neighbourhoodAbilities, neighbourhoodScope } from '../policies/neighbourhood';
import { presentNeighbourhood } from '../presenters/neighbourhood';
import { listPage } from '../services/listing';
import { assignOperators, countsFor, createNeighbourhood, removeNeighbourhood, updateNeighbourhood } from '../services/neighbourhoods';
import { readableNeighbourhood } from '../services/references';

async function present(n: Neighbourhood, actor: Actor) {
  return presentNeighbourhood(n, (await countsFor([n.id]))(n.id), actor);
}

const findReadable = readableNeighbourhood;

export function neighbourhoodRoutes() {
  const router = Router();

  router.get('/', validate('query', neighbourhoodListQuerySchema), async (req, res) => {
    const actor = actorOf(req);
    const retired = res.locals.query.retired;
    const { rows, pagination } = await listPage(Neighbourhood, res.locals.query, {
      where: { [Op.and]: [neighbourhoodScope(actor), retired === 'all' ? {} : { retiredAt: retired === 'true' ? { [Op.ne]: null } : null }] },
      sortable: ['name', 'createdAt', 'id'],
      searchable: ['name'],
      defaultSort: 'name',
    });
    const counts = await countsFor(rows.map((n) => n.id));
    res.json({
      data: rows.map((n) => presentNeighbourhood(n, counts(n.id), actor)),
      pagination,
      abilities: { create: mayCreateNeighbourhood(actor) },
    });
  });

  router.post('/', validate('body', neighbourhoodCreateSchema), async (req, res) => {
    const actor = actorOf(req);
    authorize(mayCreateNeighbourhood(actor), 'Only admins create neighbourhoods.');
    const n = await createNeighbourhood(res.locals.body);
    res.status(201).json({ data: await present(n, actor) });
  });

  router.get('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    res.json({ data: await present(await findReadable(actor, res.locals.params.id), actor) });
  });

  router.patch('/:id', validate('params', idParamsSchema), validate('body', neighbourhoodUpdateSchema), async (req, res) => {
    const actor = actorOf(req);
    const n = await findReadable(actor, res.locals.params.id);
    authorize(neighbourhoodAbilities(actor, n).update, 'Only admins change neighbourhoods.');
    await updateNeighbourhood(n, res.locals.body);
    res.json({ data: await present(n, actor) });
  });

  router.delete('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const n = await findReadable(actor, res.locals.params.id);
    authorize(neighbourhoodAbilities(actor, n).delete, 'Only admins remove neighbourhoods.');
    await removeNeighbourhood(n);
    res.status(204).end();
  });

  router.put('/:id/operators', validate('params', idParamsSchema), validate('body', operatorAssignmentSchema), async (req, res) => {
    const actor = actorOf(req);
    const n = await findReadable(actor, res.locals.params.id);
    authorize(neighbourhoodAbilities(actor, n).update, 'Only admins assign operators.');
    await assignOperators(n, res.locals.body.userIds);
    res.json({ data: await present(n, actor) });
  });

  return router;
}
