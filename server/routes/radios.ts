import { Router } from 'express';
import { idParamsSchema } from '../../shared/schemas/common';
import { radioCreateSchema, radioListQuerySchema, radioUpdateSchema } from '../../shared/schemas/radio';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { mayManage, operatesAny } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { presentRadio } from '../presenters/radio';
import { createRadio, listRadios, removeRadio, updateRadio } from '../services/radios';
import { readableNode, readableRadio } from '../services/references';

const MANAGE = 'Only admins and the operators of its neighbourhood change this radio.';

export function radioRoutes() {
  const router = Router();

  router.get('/', validate('query', radioListQuerySchema), async (req, res) => {
    const actor = actorOf(req);
    const { rows, pagination } = await listRadios(actor, res.locals.query);
    res.json({
      data: rows.map((r) => presentRadio(r, r.node!.neighbourhoodId, actor)),
      pagination,
      abilities: { create: operatesAny(actor) },
    });
  });

  router.post('/', validate('body', radioCreateSchema), async (req, res) => {
    const actor = actorOf(req);
    const body = res.locals.body;
    const node = await readableNode(actor, body.nodeId);
    authorize(mayManage(actor, node.neighbourhoodId), 'Only admins and the operators of its neighbourhood add radios to this node.');
    const radio = await createRadio(body);
    res.status(201).json({ data: presentRadio(radio, node.neighbourhoodId, actor) });
  });

  router.get('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const r = await readableRadio(actor, res.locals.params.id);
    res.json({ data: presentRadio(r, r.node!.neighbourhoodId, actor) });
  });

  router.patch('/:id', validate('params', idParamsSchema), validate('body', radioUpdateSchema), async (req, res) => {
    const actor = actorOf(req);
    const r = await readableRadio(actor, res.locals.params.id);
    authorize(mayManage(actor, r.node!.neighbourhoodId), MANAGE);
    const body = res.locals.body;
    if (body.nodeId !== undefined && body.nodeId !== r.nodeId) {
      const target = await readableNode(actor, body.nodeId);
      authorize(mayManage(actor, target.neighbourhoodId), 'You cannot move a radio to a node you do not operate.');
    }
    const fresh = await updateRadio(actor, r, body);
    res.json({ data: presentRadio(fresh, fresh.node!.neighbourhoodId, actor) });
  });

  router.delete('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const r = await readableRadio(actor, res.locals.params.id);
    authorize(mayManage(actor, r.node!.neighbourhoodId), MANAGE);
    await removeRadio(r);
    res.status(204).end();
  });

  return router;
}
