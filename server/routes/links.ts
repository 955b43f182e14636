import { Router } from 'express';
import { idParamsSchema } from '../../shared/schemas/common';
import { linkCreateSchema, linkListQuerySchema, linkUpdateSchema } from '../../shared/schemas/link';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import type { Link } from '../models';
import { type Actor, operatesAny } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { linkAbilities, mayAddLink } from '../policies/link';
import { presentLink } from '../presenters/link';
import { createLink, listLinks, removeLink, updateLink } from '../services/links';
import { endsOf, readableLink, readableRadio } from '../services/references';

const presentFor = (actor: Actor, l: Link) => presentLink(l, linkAbilities(actor, endsOf(l)));

export function linkRoutes() {
  const router = Router();

  router.get('/', validate('query', linkListQuerySchema), async (req, res) => {
    const actor = actorOf(req);
    const { rows, pagination } = await listLinks(actor, res.locals.query);
    res.json({ data: rows.map((l) => presentLink(l, linkAbilities(actor, endsOf(l)))), pagination, abilities: { create: operatesAny(actor) } });
  });

  router.post('/', validate('body', linkCreateSchema), async (req, res) => {
    const actor = actorOf(req);
    const body = res.locals.body;
    const [a, b] = await Promise.all([readableRadio(actor, body.radioAId), readableRadio(actor, body.radioBId)]);
    const ends = { neighbourhoodAId: a.node!.neighbourhoodId, neighbourhoodBId: b.node!.neighbourhoodId };
    authorize(mayAddLink(actor, ends), 'Only admins and the operators of one of its ends add this link.');
    res.status(201).json({ data: presentFor(actor, await createLink(actor, body)) });
  });

  router.get('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    res.json({ data: presentFor(actor, await readableLink(actor, res.locals.params.id)) });
  });

  router.patch('/:id', validate('params', idParamsSchema), validate('body', linkUpdateSchema), async (req, res) => {
    const actor = actorOf(req);
    const link = await readableLink(actor, res.locals.params.id);
    authorize(linkAbilities(actor, endsOf(link)).update, 'Only admins and the operators of one of its ends change this link.');
    await updateLink(link, res.locals.body);
    res.json({ data: presentFor(actor, link) });
  });

  router.delete('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const link = await readableLink(actor, res.locals.params.id);
    authorize(linkAbilities(actor, endsOf(link)).delete, 'Only admins and the operators of one of its ends remove this link.');
    await removeLink(link);
    res.status(204).end();
  });

  return router;
}
