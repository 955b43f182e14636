import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { checkAddressPlan, type AddressFinding } from '../../shared/addressing/addressPlanChecks';
import { allocateSubnets, describeSubnet, formatIpv4, parseCidr, parseIpv4, rangeOf, type Cidr } from '../../shared/addressing/cidr';
import { type Actor, isAdmin } from '../policies/actor';

export interface PlanRow {
  nodeId: number; nodeName: string; neighbourhoodId: number; cidr: string; gateway: string;
  dhcpStart: string | null; dhcpEnd: string | null; staticAddresses: string[];
}
export type PlanFinding = AddressFinding | { code: 'outside_pool'; label: string; message: string };

const PLAN_SQL = `SELECT p.node_id AS "nodeId", n.name AS "nodeName", n.neighbourhood_id AS "neighbourhoodId", p.cidr::text AS cidr,
  host(p.gateway) AS gateway, host(p.dhcp_start) AS "dhcpStart", host(p.dhcp_end) AS "dhcpEnd",
  ARRAY(SELECT host(x) FROM unnest(p.static_addresses) x) AS "staticAddresses"
  FROM node_address_plans p JOIN nodes n ON n.id = p.node_id`;

export async function loadPlans(sequelize: Sequelize, transaction?: Transaction): Promise<PlanRow[]> {
  return sequelize.query<PlanRow>(`${PLAN_SQL} ORDER BY p.cidr`, { type: QueryTypes.SELECT, transaction });
}
export async function loadPlan(sequelize: Sequelize, nodeId: number): Promise<PlanRow | null> {
  const [row] = await sequelize.query<PlanRow>(`${PLAN_SQL} WHERE p.node_id = $1`, { bind: [nodeId], type: QueryTypes.SELECT });
  return row ?? null;
}

export const mayReadPlan = (actor: Actor, p: { neighbourhoodId: number }) => isAdmin(actor) || actor.neighbourhoodIds.includes(p.neighbourhoodId);

/**
 * Checks across the whole network (a subnet can overlap one the caller cannot see), reported only for
 * plans the caller reads; nodes they cannot read are named vaguely.
 */
export function findingsFor(actor: Actor, plans: PlanRow[], pool: string | null): PlanFinding[] {
  const hidden = 'a node outside your neighbourhoods';
  const label = (p: PlanRow) => (mayReadPlan(actor, p) ? p.nodeName : hidden);
  // Readable plans first, so an overlap between a readable and a hidden subnet is reported under the readable one.
  const ordered = [...plans].sort((x, y) => Number(mayReadPlan(actor, y)) - Number(mayReadPlan(actor, x)));
  const checked = checkAddressPlan(ordered.map((p) => ({
    label: label(p), cidr: p.cidr, gateway: p.gateway, dhcpStart: p.dhcpStart ?? undefined, dhcpEnd: p.dhcpEnd ?? undefined, staticAddresses: p.staticAddresses,
  })));
  const out: PlanFinding[] = checked.filter((f) => f.label !== hidden);
  if (pool) {
    const [lo, hi] = rangeOf(parseCidr(pool));
    for (const p of plans.filter((x) => mayReadPlan(actor, x))) {
      const [a, b] = rangeOf(parseCidr(p.cidr));
      if (a < lo || b > hi) out.push({ code: 'outside_pool', label: p.nodeName, message: `${p.nodeName}: ${p.cidr} lies outside the network's pool ${pool}; allocate it again from the pool.` });
    }
  }
  return out;
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

