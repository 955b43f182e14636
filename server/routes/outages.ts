import { Router } from 'express';
import { Op, type WhereOptions } from 'sequelize';
import { idParamsSchema } from '../../shared/schemas/common';
import { hostStepSchema, outageListQuerySchema, outageNotesSchema } from '../../shared/schemas/outage';
import type { Sequelize } from 'sequelize';
import type { Config } from '../config';
import { NotFound } from '../errors';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { Node, Outage, Site, User } from '../models';
import { type Actor, isHostOfNode, mayManage } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { nodeScope } from '../policies/node';
import { presentOutage } from '../presenters/outage';
import { blastRadii } from '../services/blastRadius';
import { listPage } from '../services/listing';
import { recordHostStep, timelineOf } from '../services/outageTimeline';

const include = (actor: Actor, nodeWhere: WhereOptions = {}) => [
  { model: Node, as: 'node', required: true, where: { [Op.and]: [nodeScope(actor), nodeWhere] } },
  { model: User, as: 'acknowledger', required: false },
];

async function readableOutage(actor: Actor, id: number) {
  const o = await Outage.findOne({ where: { id }, include: include(actor) });
  if (!o) throw NotFound(`Outage ${id}`);
  return o;
}

/** Outages of the nodes the caller may read; the node's operators and admins acknowledge and annotate. */
export function outageRoutes(config: Config, sequelize: Sequelize) {
  const router = Router();
  const present = async (o: Outage, actor: Actor) => presentOutage(o, actor, config.now(), (await blastRadii(sequelize, [o.id], actor)).get(o.id));

  router.get('/', validate('query', outageListQuerySchema), async (req, res) => {
    const actor = actorOf(req);
    const q = res.locals.query;
    const where: WhereOptions = q.status === 'open' ? { endedAt: null } : q.status === 'closed' ? { endedAt: { [Op.ne]: null } } : {};
    const nodeWhere: WhereOptions = { ...(q.neighbourhoodId ? { neighbourhoodId: q.neighbourhoodId } : {}), ...(q.nodeId ? { id: q.nodeId } : {}) };
    // `blastRadius` sorts by the number of nodes cut off behind the outage, then by their clients.
    const byBlast = q.sort?.replace(/^-/, '') === 'blastRadius';
    const { rows, pagination } = await listPage(Outage, byBlast ? { ...q, sort: q.sort!.replace('blastRadius', 'blastNodeCount') } : q, {
      where,
      sortable: ['startedAt', 'endedAt', 'acknowledgedAt', 'id', 'blastNodeCount', 'blastClients'],
      searchable: [],
      defaultSort: '-startedAt',
      include: include(actor, nodeWhere),
    });
    const now = config.now();
    const blast = await blastRadii(
      sequelize,
      rows.map((o) => o.id),
      actor,
    );
    res.json({ data: rows.map((o) => presentOutage(o, actor, now, blast.get(o.id))), pagination, abilities: { create: false } });
  });

  router.get('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const outage = await readableOutage(actor, res.locals.params.id);
    res.json({ data: { ...(await present(outage, actor)), timeline: await timelineOf(sequelize, outage) } });
  });

  // The site's host (and the operators in scope) record what they did; operators see it at once.
  router.post('/:id/host-steps', validate('params', idParamsSchema), validate('body', hostStepSchema), async (req, res) => {
    const actor = actorOf(req);
    const outage = await readableOutage(actor, res.locals.params.id);
    const node = outage.node!;
    authorize(
      mayManage(actor, node.neighbourhoodId) || isHostOfNode(actor, node),
      'Only the host of this node’s site and its operators record steps taken during this outage.',
    );
    const hostUserId = (await Site.findByPk(node.siteId, { attributes: ['hostUserId'] }))?.hostUserId ?? null;
    const entry = await recordHostStep(sequelize, outage, actor, res.locals.body, hostUserId, config.now());
    res.status(201).json({ data: entry });
  });

  router.post('/:id/acknowledge', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const outage = await readableOutage(actor, res.locals.params.id);
    authorize(mayManage(actor, outage.node!.neighbourhoodId), 'Only admins and the operators of its neighbourhood acknowledge this outage.');
    if (!outage.acknowledgedAt) await outage.update({ acknowledgedAt: config.now(), acknowledgedBy: actor.id });
    res.json({ data: await present(await readableOutage(actor, outage.id), actor) });
  });

  router.patch('/:id', validate('params', idParamsSchema), validate('body', outageNotesSchema), async (req, res) => {
    const actor = actorOf(req);
    const outage = await readableOutage(actor, res.locals.params.id);
    authorize(mayManage(actor, outage.node!.neighbourhoodId), 'Only admins and the operators of its neighbourhood add notes to this outage.');
    await outage.update({ notes: res.locals.body.notes || null });
    res.json({ data: await present(await readableOutage(actor, outage.id), actor) });
  });

  return router;
}
