import { type Actor, mayManage } from './actor';
import { managedSql, type ScopeSql } from './scopeSql';

/**
 * Address plans are planning records: admins read every node's plan, operators those of their
 * neighbourhoods' nodes; hosts none (planning routes refuse them first, see mayPlan). Changing a
 * plan takes the same, so reading and managing are one rule.
 */
export const mayReadPlan = (a: Actor, p: { neighbourhoodId: number }) => mayManage(a, p.neighbourhoodId);

export const planAbilities = (a: Actor, p: { neighbourhoodId: number }) => {
  const manage = mayManage(a, p.neighbourhoodId);
  return { update: manage, delete: manage };
};

/** Nodes whose plans the actor reads, as SQL over a node alias (`planScopeSql(actor, 'n')`). */
export const planScopeSql = (a: Actor, alias = 'n'): ScopeSql => managedSql(a, alias ? `${alias}.neighbourhood_id` : 'neighbourhood_id');
