import { Router } from 'express';
import { Op } from 'sequelize';
import { idParamsSchema } from '../../shared/schemas/common';
import {
  neighbourhoodCreateSchema,
  neighbourhoodListQuerySchema,
  neighbourhoodUpdateSchema,
  operatorAssignmentSchema,
} from '../../shared/schemas/neighbourhood';
import { Invalid, NotFound } from '../errors';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { Neighbourhood, Node, OperatorAssignment, Site, User } from '../models';
import type { Actor } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { mayCreateNeighbourhood, neighbourhoodAbilities, neighbourhoodScope } from '../policies/neighbourhood';
import { presentNeighbourhood } from '../presenters/neighbourhood';
import { countOf, InUse, uniquely } from '../services/conflicts';
import { listPage } from '../services/listing';
import { recordChange } from '../services/audit';
import { domainEvents } from '../services/events';

async function countsFor(ids: number[]) {
  const [assignments, sites, nodes] = await Promise.all([
    OperatorAssignment.findAll({ where: { neighbourhoodId: ids } }),
    Site.count({ where: { neighbourhoodId: ids }, group: ['neighbourhoodId'] }),
    Node.count({ where: { neighbourhoodId: ids }, group: ['neighbourhoodId'] }),
  ]);
  const byId = (rows: { neighbourhoodId: unknown; count: number }[], id: number) =>
    rows.find((r) => Number(r.neighbourhoodId) === id)?.count ?? 0;
  return (id: number) => ({
    operatorIds: assignments.filter((a) => a.neighbourhoodId === id).map((a) => a.userId).sort((a, b) => a - b),
    siteCount: byId(sites as never, id),
    nodeCount: byId(nodes as never, id),
  });
}

async function findReadable(actor: Actor, id: number) {
  const n = await Neighbourhood.findOne({ where: { [Op.and]: [{ id }, neighbourhoodScope(actor)] } });
  if (!n) throw NotFound(`Neighbourhood ${id}`);
  return n;
}

async function present(n: Neighbourhood, actor: Actor) {
  return presentNeighbourhood(n, (await countsFor([n.id]))(n.id), actor);
}

const duplicateName = (name: string) => `A neighbourhood named "${name}" already exists. Choose another name.`;

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
    const n = await uniquely(() => Neighbourhood.create(res.locals.body), duplicateName(res.locals.body.name));
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
    const { retired, ...fields } = res.locals.body;
    // Retiring again keeps the first date, so the history says when it really stopped.
    const retiredAt = retired === undefined ? undefined : retired ? (n.retiredAt ?? new Date()) : null;
    await uniquely(() => n.update({ ...fields, ...(retiredAt === undefined ? {} : { retiredAt }) }), duplicateName(fields.name ?? n.name));
    res.json({ data: await present(n, actor) });
  });

  router.delete('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const n = await findReadable(actor, res.locals.params.id);
    authorize(neighbourhoodAbilities(actor, n).delete, 'Only admins remove neighbourhoods.');
    const { siteCount, nodeCount } = (await countsFor([n.id]))(n.id);
    if (siteCount || nodeCount) {
      const held = [siteCount && countOf(siteCount, 'site'), nodeCount && countOf(nodeCount, 'node')].filter(Boolean).join(' and ');
      throw InUse(`This neighbourhood still has ${held}. Move or remove them first.`);
    }
    await n.destroy();
    res.status(204).end();
  });

  router.put('/:id/operators', validate('params', idParamsSchema), validate('body', operatorAssignmentSchema), async (req, res) => {
    const actor = actorOf(req);
    const n = await findReadable(actor, res.locals.params.id);
    authorize(neighbourhoodAbilities(actor, n).update, 'Only admins assign operators.');
    const userIds: number[] = [...new Set<number>(res.locals.body.userIds)];
    const operators = await User.findAll({ where: { id: userIds, role: 'operator', active: true } });
    const missing = userIds.filter((id) => !operators.some((o) => o.id === id));
    if (missing.length) {
      throw Invalid(`People ${missing.join(', ')} are not active operators.`, [
        { path: 'userIds', message: `userIds ${missing.join(', ')} are not active operators` },
      ]);
    }
    const before = (await countsFor([n.id]))(n.id).operatorIds;
    await Neighbourhood.sequelize!.transaction(async (transaction) => {
      await OperatorAssignment.destroy({ where: { neighbourhoodId: n.id }, transaction });
      await OperatorAssignment.bulkCreate(userIds.map((userId) => ({ userId, neighbourhoodId: n.id })), { transaction });
      await recordChange(transaction, 'neighbourhoods', n.id, { operatorIds: before }, { operatorIds: [...userIds].sort((a, b) => a - b) }, 'operators assigned');
    });
    // Removed operators stop hearing this neighbourhood's live updates now, added ones start.
    domainEvents.emit('access-changed', { userIds: [...before, ...userIds] });
    res.json({ data: await present(n, actor) });
  });

  return router;
}
