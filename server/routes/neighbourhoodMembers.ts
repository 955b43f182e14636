import { Router } from 'express';
import { Op, type Sequelize } from 'sequelize';
import { idParamsSchema } from '../../shared/schemas/common';
import { neighbourhoodNodesSchema, type NeighbourhoodSummaryDto } from '../../shared/schemas/neighbourhood';
import type { Config } from '../config';
import { Conflict, Invalid } from '../errors';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { Node, OperatorAssignment, Site, User } from '../models';
import { authorize } from '../policies/authorize';
import { neighbourhoodAbilities } from '../policies/neighbourhood';
import { nodeScope } from '../policies/node';
import { siteScope } from '../policies/site';
import { availabilityOf } from '../services/nodeAvailability';
import { readableNeighbourhood } from '../services/references';

/** Mounted at /neighbourhoods/:id: what is in a neighbourhood, and moving nodes into it in bulk. */
export function neighbourhoodMemberRoutes(config: Config, sequelize: Sequelize) {
  const router = Router({ mergeParams: true });

  router.get('/summary', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const n = await readableNeighbourhood(actor, res.locals.params.id);
    const [nodes, sites, assignments] = await Promise.all([
      Node.findAll({ where: { [Op.and]: [{ neighbourhoodId: n.id }, nodeScope(actor)] }, order: [['name', 'ASC']] }),
      Site.findAll({ where: { [Op.and]: [{ neighbourhoodId: n.id }, siteScope(actor)] }, include: [{ model: User, as: 'host', attributes: ['id', 'name'] }], order: [['name', 'ASC']] }),
      OperatorAssignment.findAll({ where: { neighbourhoodId: n.id } }),
    ]);
    const siteNames = new Map((await Site.findAll({ where: { id: [...new Set(nodes.map((x) => x.siteId))] }, attributes: ['id', 'name'] })).map((s) => [s.id, s.name]));
    const operators = await User.findAll({ where: { id: assignments.map((a) => a.userId) }, attributes: ['id', 'name'], order: [['name', 'ASC']] });
    const availability = await availabilityOf(sequelize, nodes, config.now());
    const data: NeighbourhoodSummaryDto = {
      availability: availability.pooled,
      nodes: nodes.map((x) => ({ id: x.id, name: x.name, state: x.state, siteId: x.siteId, siteName: siteNames.get(x.siteId) ?? '', availability: availability.byNode(x.id) })),
      operators: operators.map((o) => ({ id: o.id, name: o.name })),
      hosts: sites.map((s) => ({ siteId: s.id, siteName: s.name, host: s.host ? { id: s.host.id, name: s.host.name } : null })),
    };
    res.json({ data });
  });

  router.post('/nodes', validate('params', idParamsSchema), validate('body', neighbourhoodNodesSchema), async (req, res) => {
    const actor = actorOf(req);
    const n = await readableNeighbourhood(actor, res.locals.params.id);
    authorize(neighbourhoodAbilities(actor, n).update, 'Only admins move nodes between neighbourhoods.');
    if (n.retiredAt) throw Conflict(`${n.name} is retired; bring it back before moving nodes into it.`, 'retired');
    const ids: number[] = [...new Set<number>(res.locals.body.nodeIds)];
    const nodes = await Node.findAll({ where: { id: ids } });
    const missing = ids.filter((id) => !nodes.some((x) => x.id === id));
    if (missing.length) {
      throw Invalid(`Nodes ${missing.join(', ')} do not exist.`, [{ path: 'nodeIds', message: `nodeIds ${missing.join(', ')} do not exist` }]);
    }
    // One node at a time inside one transaction: all move or none, and each move is in the history.
    const moved = await sequelize.transaction(async (transaction) => {
      let count = 0;
      for (const node of nodes) {
        if (node.neighbourhoodId === n.id) continue;
        await node.update({ neighbourhoodId: n.id }, { transaction });
        count++;
      }
      return count;
    });
    res.json({ data: { neighbourhoodId: n.id, moved, unchanged: nodes.length - moved } });
  });

  return router;
}
