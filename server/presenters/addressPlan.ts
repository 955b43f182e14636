import type { AddressFindingDto, AddressPlanDto, AddressPlansDto, UnplannedNodeDto } from '../../shared/schemas/planningRecords';
import type { Actor } from '../policies/actor';
import { mayReadPlan, planAbilities } from '../policies/addressPlan';
import { mayManage } from '../policies/actor';
import type { PlanFinding, PlanRow, UnplannedNode } from '../services/addressPlans';

export const presentPlan = (actor: Actor, p: PlanRow): AddressPlanDto => ({
  nodeId: p.nodeId,
  nodeName: p.nodeName,
  neighbourhoodId: p.neighbourhoodId,
  cidr: p.cidr,
  gateway: p.gateway,
  dhcpStart: p.dhcpStart,
  dhcpEnd: p.dhcpEnd,
  staticAddresses: p.staticAddresses,
  abilities: planAbilities(actor, p),
});

/** The nodes a finding is about stay on the server: one of them may be a node the caller cannot read. */
export const presentFinding = (f: PlanFinding): AddressFindingDto => ({ code: f.code, label: f.label, message: f.message });

const presentUnplanned = (actor: Actor, n: UnplannedNode): UnplannedNodeDto => ({ ...n, abilities: { allocate: mayManage(actor, n.neighbourhoodId) } });

export const presentPlans = (actor: Actor, pool: string | null, plans: PlanRow[], unplanned: UnplannedNode[], findings: PlanFinding[]): AddressPlansDto => ({
  pool,
  plans: plans.filter((p) => mayReadPlan(actor, p)).map((p) => presentPlan(actor, p)),
  unplannedNodes: unplanned.map((n) => presentUnplanned(actor, n)),
  findings: findings.map(presentFinding),
});
