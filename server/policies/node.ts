import { Op, type WhereOptions } from 'sequelize';
import type { Node } from '../models';
import { type Actor, isAdmin, isHostOfSite, isOperatorOf, mayManage } from './actor';
import { column, intArray, operatedIds, type ScopeSql } from './scopeSql';

/*
 * Who may read a node, the one rule: admins every node, operators the nodes of the neighbourhoods
 * they are assigned to, anyone the nodes on the sites they host. A deactivated person has no actor
 * at all (loadActor answers null), so reads nothing. The same rule in four shapes, all tested
 * against each other in tests/api/policy-table.test.ts:
 *   mayReadNode   – a predicate on a loaded node
 *   nodeScope     – a Sequelize where clause on the Node model (or an include of it)
 *   nodeScopeSql  – a SQL boolean expression for raw queries over `nodes <alias>`
 *   nodeRooms / roomsOf – the socket.io rooms a node's events go to and an actor listens in
 */

export const mayReadNode = (a: Actor, n: Pick<Node, 'neighbourhoodId' | 'siteId'>) =>
  isAdmin(a) || isOperatorOf(a, n.neighbourhoodId) || isHostOfSite(a, n.siteId);

/** Admins see every node, operators their neighbourhoods' nodes, hosts the nodes of the sites they host. */
export function nodeScope(a: Actor): WhereOptions {
  if (isAdmin(a)) return {};
  const or: WhereOptions[] = [{ siteId: { [Op.in]: a.hostedSiteIds } }];
  if (a.role === 'operator') or.push({ neighbourhoodId: { [Op.in]: a.neighbourhoodIds } });
  return { [Op.or]: or };
}

/**
 * nodeScope for raw SQL: `nodeScopeSql(actor, 'n')` is a boolean expression over `n.neighbourhood_id`
 * and `n.site_id` (use `''` for no alias). It has no bind parameters, so it joins any query:
 *   sequelize.query(`SELECT … FROM nodes n WHERE ${nodeScopeSql(actor, 'n')} AND n.state = $1`, { bind: [state] })
 */
export function nodeScopeSql(a: Actor, alias = 'n'): ScopeSql {
  if (isAdmin(a)) return 'true';
  const or = a.hostedSiteIds.length ? [`${column(alias, 'site_id')} = ANY(${intArray(a.hostedSiteIds)})`] : [];
  const hoods = operatedIds(a);
  if (hoods.length) or.push(`${column(alias, 'neighbourhood_id')} = ANY(${intArray(hoods)})`);
  return or.length ? `(${or.join(' OR ')})` : 'false';
}

/** Rooms an event about a node goes to: the admins, its neighbourhood's operators, its site's host. */
export function nodeRooms(n: { neighbourhoodId: number; hostUserId: number | null }): string[] {
  const rooms = ['admins', `hood:${n.neighbourhoodId}`];
  if (n.hostUserId) rooms.push(`host:${n.hostUserId}`);
  return rooms;
}

/** Rooms an actor listens in: deny by default, exactly the nodes they may read over the API. */
export function roomsOf(a: Actor): string[] {
  if (isAdmin(a)) return ['admins'];
  return [`host:${a.id}`, ...operatedIds(a).map((id) => `hood:${id}`)];
}

export const nodeAbilities = (a: Actor, n: Pick<Node, 'neighbourhoodId'>) => {
  const manage = mayManage(a, n.neighbourhoodId);
  return { update: manage, delete: manage };
};
