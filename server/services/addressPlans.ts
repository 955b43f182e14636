import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { checkAddressPlan, type AddressFinding } from '../../shared/addressing/addressPlanChecks';
import { allocateSubnets, describeSubnet, formatIpv4, parseCidr, parseIpv4, rangeOf, type Cidr } from '../../shared/addressing/cidr';
import type { NodeAddressPlanBody } from '../../shared/schemas/planningRecords';
import { Conflict, NotFound } from '../errors';
import { NetworkSettings } from '../models';
import type { Actor } from '../policies/actor';
import { mayReadPlan, planScopeSql } from '../policies/addressPlan';
import { recordChanges } from './changeHistory';

export interface PlanRow {
  nodeId: number;
  nodeName: string;
  neighbourhoodId: number;
  cidr: string;
  gateway: string;
  dhcpStart: string | null;
  dhcpEnd: string | null;
  staticAddresses: string[];
}
/** A finding with the nodes it is about, so callers filter by node and code, never by the text. */
export interface PlanFinding {
  code: AddressFinding['code'] | 'outside_pool';
  label: string;
  message: string;
  nodeIds: number[];
}
export interface UnplannedNode {
  nodeId: number;
  nodeName: string;
  neighbourhoodId: number;
}

const PLAN_SQL = `SELECT p.node_id AS "nodeId", n.name AS "nodeName", n.neighbourhood_id AS "neighbourhoodId", p.cidr::text AS cidr,
  host(p.gateway) AS gateway, host(p.dhcp_start) AS "dhcpStart", host(p.dhcp_end) AS "dhcpEnd",
  ARRAY(SELECT host(x) FROM unnest(p.static_addresses) x) AS "staticAddresses"
  FROM node_address_plans p JOIN nodes n ON n.id = p.node_id`;

const UPSERT = `INSERT INTO node_address_plans (node_id, cidr, gateway, dhcp_start, dhcp_end, static_addresses)
  VALUES ($1, $2::cidr, $3::inet, $4::inet, $5::inet, $6::inet[])
  ON CONFLICT (node_id) DO UPDATE SET cidr = EXCLUDED.cidr, gateway = EXCLUDED.gateway, dhcp_start = EXCLUDED.dhcp_start,
    dhcp_end = EXCLUDED.dhcp_end, static_addresses = EXCLUDED.static_addresses, updated_at = now()`;
// One allocation or change at a time, so two people cannot be handed the same free block.
const LOCK = "SELECT pg_advisory_xact_lock(hashtext('node_address_plans'))";

/** Every plan in the network (checks need them all, even those the caller cannot read). */
export async function loadPlans(sequelize: Sequelize, transaction?: Transaction): Promise<PlanRow[]> {
  return sequelize.query<PlanRow>(`${PLAN_SQL} ORDER BY p.cidr`, { type: QueryTypes.SELECT, transaction });
}
export async function loadPlan(sequelize: Sequelize, nodeId: number): Promise<PlanRow | null> {
  const [row] = await sequelize.query<PlanRow>(`${PLAN_SQL} WHERE p.node_id = $1`, { bind: [nodeId], type: QueryTypes.SELECT });
  return row ?? null;
}

/** The nodes the caller plans for that have no subnet yet, by name. */
export async function unplannedNodes(sequelize: Sequelize, actor: Actor): Promise<UnplannedNode[]> {
  return sequelize.query<UnplannedNode>(
    `SELECT n.id AS "nodeId", n.name AS "nodeName", n.neighbourhood_id AS "neighbourhoodId" FROM nodes n
      WHERE ${planScopeSql(actor, 'n')} AND NOT EXISTS (SELECT 1 FROM node_address_plans p WHERE p.node_id = n.id) ORDER BY n.name`,
    { type: QueryTypes.SELECT },
  );
}

/** The network's pool (null until an admin sets it). */
export async function addressPool(): Promise<string | null> {
  return (await NetworkSettings.findByPk(1, { rejectOnEmpty: true })).addressPool ?? null;
}

/**
 * Checks across the whole network (a subnet can overlap one the caller cannot see), reported only for
 * plans the caller reads; nodes they cannot read are named vaguely.
 */
export function findingsFor(actor: Actor, plans: PlanRow[], pool: string | null): PlanFinding[] {
  const hidden = 'a node outside your neighbourhoods';
  // Readable plans first, so an overlap between a readable and a hidden subnet is reported under the readable one.
  const ordered = [...plans].sort((x, y) => Number(mayReadPlan(actor, y)) - Number(mayReadPlan(actor, x)));
  const checked = checkAddressPlan(
    ordered.map((p) => ({
      label: mayReadPlan(actor, p) ? p.nodeName : hidden,
      cidr: p.cidr,
      gateway: p.gateway,
      dhcpStart: p.dhcpStart ?? undefined,
      dhcpEnd: p.dhcpEnd ?? undefined,
      staticAddresses: p.staticAddresses,
    })),
  );
  const out: PlanFinding[] = checked
    .filter((f) => mayReadPlan(actor, ordered[f.subnets[0]]))
    .map((f) => ({ code: f.code, label: f.label, message: f.message, nodeIds: f.subnets.map((i) => ordered[i].nodeId) }));
  if (pool) {
    const [lo, hi] = rangeOf(parseCidr(pool));
    for (const p of plans.filter((x) => mayReadPlan(actor, x))) {
      const [a, b] = rangeOf(parseCidr(p.cidr));
      if (a < lo || b > hi) {
        const message = `${p.nodeName}: ${p.cidr} lies outside the network's pool ${pool}; allocate it again from the pool.`;
        out.push({ code: 'outside_pool', label: p.nodeName, nodeIds: [p.nodeId], message });
      }
    }
  }
  return out;
}

/** The findings about one node (its own, and overlaps it takes part in either way round). */
export const findingsAbout = (findings: PlanFinding[], nodeId: number) => findings.filter((f) => f.nodeIds.includes(nodeId));

const snapshot = (p: PlanRow | null) =>
  p ? { cidr: p.cidr, gateway: p.gateway, dhcpStart: p.dhcpStart, dhcpEnd: p.dhcpEnd, staticAddresses: p.staticAddresses } : null;

/** Hands each node the next free block of the pool, all or none, recorded in the change history. */
export async function allocatePlans(sequelize: Sequelize, actor: Actor, nodeIds: number[], prefixLength: number): Promise<PlanRow[]> {
  const pool = await addressPool();
  if (!pool) throw Conflict('The network has no address pool yet; an admin sets it under network settings first.', 'pool_not_set');
  const made = await sequelize.transaction(async (transaction) => {
    await sequelize.query(LOCK, { transaction });
    const existing = await loadPlans(sequelize, transaction);
    const already = existing.filter((p) => nodeIds.includes(p.nodeId));
    if (already.length > 0) {
      const names = already.map((p) => p.nodeName).join(', ');
      throw Conflict(`${names} already ha${already.length > 1 ? 've' : 's'} a subnet; change it instead of allocating another.`, 'already_planned');
    }
    const plans = allocateFor(pool, prefixLength, nodeIds, existing);
    for (const p of plans) await sequelize.query(UPSERT, { bind: [p.nodeId, p.cidr, p.gateway, p.dhcpStart, p.dhcpEnd, '{}'], transaction });
    await recordChanges(
      sequelize,
      plans.map((p) => ({
        tableName: 'node_address_plans',
        recordId: p.nodeId,
        action: 'create' as const,
        changedBy: actor.id,
        reason: 'allocated from the pool',
        before: null,
        after: { ...p, staticAddresses: [] },
      })),
      transaction,
    );
    return plans;
  });
  return (await Promise.all(made.map((p) => loadPlan(sequelize, p.nodeId)))).filter((p): p is PlanRow => p !== null);
}

/** Sets one node's plan; answers whether it is new, the stored plan, and the findings about that node. */
export async function savePlan(sequelize: Sequelize, actor: Actor, nodeId: number, b: NodeAddressPlanBody) {
  const before = await loadPlan(sequelize, nodeId);
  await sequelize.transaction(async (transaction) => {
    await sequelize.query(LOCK, { transaction });
    const bind = [nodeId, b.cidr, b.gateway, b.dhcpStart ?? null, b.dhcpEnd ?? null, `{${b.staticAddresses.join(',')}}`];
    await sequelize.query(UPSERT, { bind, transaction });
    await recordChanges(
      sequelize,
      [
        {
          tableName: 'node_address_plans',
          recordId: nodeId,
          action: before ? 'update' : 'create',
          changedBy: actor.id,
          before: snapshot(before),
          after: { ...b },
        },
      ],
      transaction,
    );
  });
  const plan = (await loadPlan(sequelize, nodeId))!;
  const findings = findingsAbout(findingsFor(actor, await loadPlans(sequelize), await addressPool()), nodeId);
  return { created: !before, plan, findings };
}

/** Removes one node's plan (404 when it has none), recorded in the change history. */
export async function deletePlan(sequelize: Sequelize, actor: Actor, nodeId: number) {
  const before = await loadPlan(sequelize, nodeId);
  if (!before) throw NotFound(`The address plan of node ${nodeId}`);
  await sequelize.transaction(async (transaction) => {
    await sequelize.query('DELETE FROM node_address_plans WHERE node_id = $1', { bind: [nodeId], transaction });
    await recordChanges(
      sequelize,
      [
        {
          tableName: 'node_address_plans',
          recordId: nodeId,
          action: 'delete',
          changedBy: actor.id,
          before: snapshot(before),
          after: null,
        },
      ],
      transaction,
    );
  });
}

/**
 * Parapet's layout of a node subnet: the gateway is the first host; the next few hosts stay free for static
 * addresses (a quarter of the hosts, at most 9: .2–.10 in a /24); DHCP hands out the rest up to the last host.
 */
export function layoutSubnet(c: Cidr) {
  const d = describeSubnet(c);
  const first = parseIpv4(d.firstHost)!;
  const last = parseIpv4(d.lastHost)!;
  const hostsAfterGateway = last - first;
  const reserved = Math.min(9, Math.floor(hostsAfterGateway / 4));
  const dhcpStart = hostsAfterGateway >= 1 ? formatIpv4(first + 1 + reserved) : null;
  return { cidr: d.cidr, gateway: d.gateway, dhcpStart, dhcpEnd: dhcpStart ? d.lastHost : null };
}

/** The first free subnets of the pool for the given nodes, in node order; existing plans count as taken. */
export function allocateFor(pool: string, prefixLength: number, nodeIds: number[], existing: PlanRow[]) {
  const taken = existing.map((p) => p.cidr);
  return allocateSubnets(pool, prefixLength, nodeIds.length, taken).map((c, i) => ({ nodeId: nodeIds[i], ...layoutSubnet(c) }));
}
