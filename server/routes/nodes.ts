import { Router } from 'express';
import { idParamsSchema } from '../../shared/schemas/common';
import { nodeCreateSchema, nodeListQuerySchema, nodeUpdateSchema } from '../../shared/schemas/node';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { Node } from '../models';
import { isAdmin, mayManage, operatesAny } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { nodeAbilities, nodeScope } from '../policies/node';
import { presentNode } from '../presenters/node';
import { uniquely } from '../services/conflicts';
import { filters, listPage } from '../services/listing';
import { readableNeighbourhood, readableNode, readableSite } from '../services/references';

const MANAGE = 'Only admins and the operators of its neighbourhood change this node.';

const duplicateName = (name: string) => `A node named "${name}" already exists; node names are unique across the network. Choose another name.`;

export function nodeRoutes() {
  const router = Router();

  router.get('/', validate('query', nodeListQuerySchema), async (req, res) => {
    const actor = actorOf(req);
    const q = res.locals.query;
    const { rows, pagination } = await listPage(Node, q, {
      where: { ...nodeScope(actor), ...filters({ state: q.state, neighbourhoodId: q.neighbourhoodId, siteId: q.siteId }) },
      sortable: ['name', 'state', 'neighbourhoodId', 'siteId', 'lastSeenAt', 'reportIntervalS', 'createdAt', 'id'],
      searchable: ['name', 'hardware', 'firmware'],
      defaultSort: 'name',
    });
    res.json({
      data: rows.map((n) => presentNode(n, actor)),
      pagination,
      abilities: { create: operatesAny(actor) },
    });
  });

  router.post('/', validate('body', nodeCreateSchema), async (req, res) => {
    const actor = actorOf(req);
    const body = res.locals.body;
    const site = await readableSite(actor, body.siteId);
    // A node belongs to its site's neighbourhood unless told otherwise.
    const neighbourhoodId: number = body.neighbourhoodId ?? site.neighbourhoodId;
    if (body.neighbourhoodId !== undefined) await readableNeighbourhood(actor, neighbourhoodId);
    authorize(
      mayManage(actor, neighbourhoodId) && mayManage(actor, site.neighbourhoodId),
      'Only admins and the operators of that neighbourhood add nodes to it.',
    );
    // The form always sends the box; only ticking it is an admin's call.
    if (body.isUplink) authorize(isAdmin(actor), 'Only admins mark which nodes carry the uplink.');
    const node = await uniquely(() => Node.create({ ...body, neighbourhoodId, stateSince: null }), duplicateName(body.name));
    res.status(201).json({ data: presentNode(node, actor) });
  });

  router.get('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    res.json({ data: presentNode(await readableNode(actor, res.locals.params.id), actor) });
  });

  router.patch('/:id', validate('params', idParamsSchema), validate('body', nodeUpdateSchema), async (req, res) => {
    const actor = actorOf(req);
    const node = await readableNode(actor, res.locals.params.id);
    authorize(nodeAbilities(actor, node).update, MANAGE);
    const body = res.locals.body;
    if (body.siteId !== undefined && body.siteId !== node.siteId) {
      const site = await readableSite(actor, body.siteId);
      authorize(mayManage(actor, site.neighbourhoodId), 'You cannot move a node to a site you do not operate.');
    }
    if (body.neighbourhoodId !== undefined && body.neighbourhoodId !== node.neighbourhoodId) {
      await readableNeighbourhood(actor, body.neighbourhoodId);
      authorize(mayManage(actor, body.neighbourhoodId), 'You cannot move a node into a neighbourhood you do not operate.');
    }
    if (body.isUplink !== undefined && body.isUplink !== node.isUplink) authorize(isAdmin(actor), 'Only admins mark which nodes carry the uplink.');
    await uniquely(() => node.update(body), duplicateName(body.name ?? node.name));
    res.json({ data: presentNode(node, actor) });
  });

  router.delete('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const node = await readableNode(actor, res.locals.params.id);
    authorize(nodeAbilities(actor, node).delete, MANAGE);
    await node.destroy();
    res.status(204).end();
  });

  return router;
}
