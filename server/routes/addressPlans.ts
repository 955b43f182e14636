import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { idParamsSchema } from '../../shared/schemas/common';
import { addressAllocateSchema, nodeAddressPlanSchema, type AddressAllocateBody, type NodeAddressPlanBody } from '../../shared/schemas/planningRecords';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { mayManage } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { mayPlan } from '../policies/planning';
import { presentFinding, presentPlan, presentPlans } from '../presenters/addressPlan';
import { addressPool, allocatePlans, deletePlan, findingsFor, loadPlans, savePlan, unplannedNodes } from '../services/addressPlans';
import { readableNode } from '../services/references';

const MANAGE = 'Only admins and the operators of its neighbourhood change this node’s addresses.';

/** Per-node subnets and DHCP ranges out of the network's pool, with the plan-wide checks. */
export function addressPlanRoutes(sequelize: Sequelize) {
  const router = Router();
  router.use((req, _res, next) => {
    authorize(mayPlan(actorOf(req)), 'Address plans are for operators and admins.');
    next();
  });

  router.get('/', async (req, res) => {
    const actor = actorOf(req);
    const [pool, plans, unplanned] = await Promise.all([addressPool(), loadPlans(sequelize), unplannedNodes(sequelize, actor)]);
    res.json({ data: presentPlans(actor, pool, plans, unplanned, findingsFor(actor, plans, pool)) });
  });

  router.post('/allocate', validate('body', addressAllocateSchema), async (req, res) => {
    const actor = actorOf(req);
    const body = res.locals.body as AddressAllocateBody;
    const nodeIds = [...new Set(body.nodeIds)];
    for (const id of nodeIds) authorize(mayManage(actor, (await readableNode(actor, id)).neighbourhoodId), MANAGE);
    const made = await allocatePlans(sequelize, actor, nodeIds, body.prefixLength);
    res.status(201).json({ data: made.map((p) => presentPlan(actor, p)) });
  });

  router.put('/:id', validate('params', idParamsSchema), validate('body', nodeAddressPlanSchema), async (req, res) => {
    const actor = actorOf(req);
    const node = await readableNode(actor, res.locals.params.id);
    authorize(mayManage(actor, node.neighbourhoodId), MANAGE);
    const { created, plan, findings } = await savePlan(sequelize, actor, node.id, res.locals.body as NodeAddressPlanBody);
    res.status(created ? 201 : 200).json({ data: presentPlan(actor, plan), findings: findings.map(presentFinding) });
  });

  router.delete('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const node = await readableNode(actor, res.locals.params.id);
    authorize(mayManage(actor, node.neighbourhoodId), MANAGE);
    await deletePlan(sequelize, actor, node.id);
    res.status(204).end();
  });
  return router;
}
