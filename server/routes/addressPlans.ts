import { Router } from 'express';
import { QueryTypes, type Sequelize } from 'sequelize';
import { idParamsSchema } from '../../shared/schemas/common';
import { addressAllocateSchema, nodeAddressPlanSchema, type AddressAllocateBody, type NodeAddressPlanBody } from '../../shared/schemas/planningRecords';
import { Conflict, NotFound } from '../errors';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { NetworkSettings } from '../models';
import { type Actor, isAdmin, mayManage } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { mayPlan } from '../policies/planning';
import { allocateFor, findingsFor, loadPlan, loadPlans, mayReadPlan, type PlanRow } from '../services/addressPlans';
import { recordChanges } from '../services/changeHistory';
import { readableNode } from '../services/references';

const MANAGE = 'Only admins and the operators of its neighbourhood change this node’s addresses.';
const present = (actor: Actor, p: PlanRow) => ({ ...p, abilities: { update: mayManage(actor, p.neighbourhoodId), delete: mayManage(actor, p.neighbourhoodId) } });
const snapshot = (p: PlanRow | null) => (p ? { cidr: p.cidr, gateway: p.gateway, dhcpStart: p.dhcpStart, dhcpEnd: p.dhcpEnd, staticAddresses: p.staticAddresses } : null);

const UPSERT = `INSERT INTO node_address_plans (node_id, cidr, gateway, dhcp_start, dhcp_end, static_addresses)
  VALUES ($1, $2::cidr, $3::inet, $4::inet, $5::inet, $6::inet[])
  ON CONFLICT (node_id) DO UPDATE SET cidr = EXCLUDED.cidr, gateway = EXCLUDED.gateway, dhcp_start = EXCLUDED.dhcp_start,
    dhcp_end = EXCLUDED.dhcp_end, static_addresses = EXCLUDED.static_addresses, updated_at = now()`;
// One allocation at a time, so two people cannot be handed the same free block.
const LOCK = "SELECT pg_advisory_xact_lock(hashtext('node_address_plans'))";

/** Per-node subnets and DHCP ranges out of the network's pool, with the plan-wide checks. */
export function addressPlanRoutes(sequelize: Sequelize) {
  const router = Router();
  router.use((req, _res, next) => {
    authorize(mayPlan(actorOf(req)), 'Address plans are for operators and admins.');
    next();
  });

  router.get('/', async (req, res) => {
    const actor = actorOf(req);
    const [{ addressPool }, plans] = await Promise.all([NetworkSettings.findByPk(1, { rejectOnEmpty: true }), loadPlans(sequelize)]);
    const planned = new Set(plans.map((p) => p.nodeId));
    const nodes = await sequelize.query<{ nodeId: number; nodeName: string; neighbourhoodId: number }>(
      `SELECT id AS "nodeId", name AS "nodeName", neighbourhood_id AS "neighbourhoodId" FROM nodes WHERE ($1 OR neighbourhood_id = ANY($2::int[])) ORDER BY name`,
      { bind: [isAdmin(actor), actor.neighbourhoodIds], type: QueryTypes.SELECT },
    );
    res.json({
      data: {
        pool: addressPool ?? null,
        plans: plans.filter((p) => mayReadPlan(actor, p)).map((p) => present(actor, p)),
        unplannedNodes: nodes.filter((n) => !planned.has(n.nodeId)).map((n) => ({ ...n, abilities: { allocate: mayManage(actor, n.neighbourhoodId) } })),
        findings: findingsFor(actor, plans, addressPool ?? null),
      },
    });
  });

  router.post('/allocate', validate('body', addressAllocateSchema), async (req, res) => {
    const actor = actorOf(req);
    const body = res.locals.body as AddressAllocateBody;
    const nodeIds = [...new Set(body.nodeIds)];
    for (const id of nodeIds) authorize(mayManage(actor, (await readableNode(actor, id)).neighbourhoodId), MANAGE);
    const { addressPool } = await NetworkSettings.findByPk(1, { rejectOnEmpty: true });
    if (!addressPool) throw Conflict('The network has no address pool yet; an admin sets it under network settings first.', 'pool_not_set');
    const made = await sequelize.transaction(async (transaction) => {
      await sequelize.query(LOCK, { transaction });
      const existing = await loadPlans(sequelize, transaction);
      const already = existing.filter((p) => nodeIds.includes(p.nodeId));
      if (already.length > 0) throw Conflict(`${already.map((p) => p.nodeName).join(', ')} already ha${already.length > 1 ? 've' : 's'} a subnet; change it instead of allocating another.`, 'already_planned');
      const plans = allocateFor(addressPool, body.prefixLength, nodeIds, existing);
      for (const p of plans) await sequelize.query(UPSERT, { bind: [p.nodeId, p.cidr, p.gateway, p.dhcpStart, p.dhcpEnd, '{}'], transaction });
      await recordChanges(sequelize, plans.map((p) => ({ tableName: 'node_address_plans', recordId: p.nodeId, action: 'create' as const, changedBy: actor.id, reason: 'allocated from the pool', before: null, after: { ...p, staticAddresses: [] } })), transaction);
      return plans;
    });
    const fresh = await Promise.all(made.map((p) => loadPlan(sequelize, p.nodeId)));
    res.status(201).json({ data: fresh.map((p) => present(actor, p!)) });
  });

  router.put('/:id', validate('params', idParamsSchema), validate('body', nodeAddressPlanSchema), async (req, res) => {
    const actor = actorOf(req);
    const node = await readableNode(actor, res.locals.params.id);
    authorize(mayManage(actor, node.neighbourhoodId), MANAGE);
    const b = res.locals.body as NodeAddressPlanBody;
    const before = await loadPlan(sequelize, node.id);
    await sequelize.transaction(async (transaction) => {
      await sequelize.query(LOCK, { transaction });
      await sequelize.query(UPSERT, { bind: [node.id, b.cidr, b.gateway, b.dhcpStart ?? null, b.dhcpEnd ?? null, `{${b.staticAddresses.join(',')}}`], transaction });
      await recordChanges(sequelize, [{ tableName: 'node_address_plans', recordId: node.id, action: before ? 'update' : 'create', changedBy: actor.id, before: snapshot(before), after: { ...b } }], transaction);
    });
    const plan = (await loadPlan(sequelize, node.id))!;
    const { addressPool } = await NetworkSettings.findByPk(1, { rejectOnEmpty: true });
    const findings = findingsFor(actor, await loadPlans(sequelize), addressPool ?? null).filter((f) => f.label === plan.nodeName || f.message.includes(plan.cidr));
    res.status(before ? 200 : 201).json({ data: present(actor, plan), findings });
  });

  router.delete('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const node = await readableNode(actor, res.locals.params.id);
    authorize(mayManage(actor, node.neighbourhoodId), MANAGE);
    const before = await loadPlan(sequelize, node.id);
    if (!before) throw NotFound(`The address plan of node ${node.id}`);
    await sequelize.transaction(async (transaction) => {
      await sequelize.query('DELETE FROM node_address_plans WHERE node_id = $1', { bind: [node.id], transaction });
      await recordChanges(sequelize, [{ tableName: 'node_address_plans', recordId: node.id, action: 'delete', changedBy: actor.id, before: snapshot(before), after: null }], transaction);
    });
    res.status(204).end();
  });
  return router;
}
