import { Router } from 'express';
import { Op, type WhereOptions } from 'sequelize';
import { idParamsSchema } from '../../shared/schemas/common';
import { linkCreateSchema, linkListQuerySchema, linkUpdateSchema } from '../../shared/schemas/link';
import { NotFound } from '../errors';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { Link, Node, Radio } from '../models';
import { type Actor, isAdmin, mayManage } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { presentLink } from '../presenters/link';
import { uniquely } from '../services/conflicts';
import { listPage } from '../services/listing';
import { readableRadio } from './radios';

const ends = [
  { model: Radio, as: 'radioA', required: true, include: [{ model: Node, as: 'node', required: true }] },
  { model: Radio, as: 'radioB', required: true, include: [{ model: Node, as: 'node', required: true }] },
];

/** Links are infrastructure: admins see all, operators those touching their neighbourhoods, hosts none. */
function linkScope(a: Actor): WhereOptions {
  if (isAdmin(a)) return {};
  const ids = a.role === 'operator' ? a.neighbourhoodIds : [];
  return { [Op.or]: [{ '$radioA.node.neighbourhood_id$': { [Op.in]: ids } }, { '$radioB.node.neighbourhood_id$': { [Op.in]: ids } }] };
}

const linkAbilities = (a: Actor, l: Link) => {
  const manage = mayManage(a, l.radioA!.node!.neighbourhoodId) || mayManage(a, l.radioB!.node!.neighbourhoodId);
  return { update: manage, delete: manage };
};

async function readableLink(actor: Actor, id: number) {
  const l = await Link.findOne({ where: { [Op.and]: [{ id }, linkScope(actor)] }, include: ends });
  if (!l) throw NotFound(`Link ${id}`);
  return l;
}

export function linkRoutes() {
  const router = Router();

  router.get('/', validate('query', linkListQuerySchema), async (req, res) => {
    const actor = actorOf(req);
    const q = res.locals.query;
    const where: WhereOptions[] = [linkScope(actor)];
    if (q.status) where.push({ status: q.status });
    if (q.nodeId) where.push({ [Op.or]: [{ '$radioA.node_id$': q.nodeId }, { '$radioB.node_id$': q.nodeId }] });
    const { rows, pagination } = await listPage(Link, q, {
      where: { [Op.and]: where },
      sortable: ['name', 'status', 'createdAt', 'id'],
      searchable: ['name'],
      defaultSort: 'id',
      include: ends,
    });
    res.json({
      data: rows.map((l) => presentLink(l, linkAbilities(actor, l))),
      pagination,
      abilities: { create: isAdmin(actor) || actor.neighbourhoodIds.length > 0 },
    });
  });

  router.post('/', validate('body', linkCreateSchema), async (req, res) => {
    const actor = actorOf(req);
    const body = res.locals.body;
    const [a, b] = await Promise.all([readableRadio(actor, body.radioAId), readableRadio(actor, body.radioBId)]);
    authorize(mayManage(actor, a.node!.neighbourhoodId) || mayManage(actor, b.node!.neighbourhoodId), 'Only admins and the operators of one of its ends add this link.');
    const link = await uniquely(() => Link.create(body), `Radios ${body.radioAId} and ${body.radioBId} are already linked. Change that link instead of adding another.`);
    res.status(201).json({ data: presentLinkFor(actor, await readableLink(actor, link.id)) });
  });

  router.get('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    res.json({ data: presentLinkFor(actor, await readableLink(actor, res.locals.params.id)) });
  });

  router.patch('/:id', validate('params', idParamsSchema), validate('body', linkUpdateSchema), async (req, res) => {
    const actor = actorOf(req);
    const link = await readableLink(actor, res.locals.params.id);
    authorize(linkAbilities(actor, link).update, 'Only admins and the operators of one of its ends change this link.');
    await link.update(res.locals.body);
    res.json({ data: presentLinkFor(actor, link) });
  });

  router.delete('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const link = await readableLink(actor, res.locals.params.id);
    authorize(linkAbilities(actor, link).delete, 'Only admins and the operators of one of its ends remove this link.');
    await link.destroy();
    res.status(204).end();
  });

  return router;
}

const presentLinkFor = (actor: Actor, l: Link) => presentLink(l, linkAbilities(actor, l));
