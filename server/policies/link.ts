import { Op, type WhereOptions } from 'sequelize';
import { type Actor, isAdmin, isOperatorOf, mayManage } from './actor';
import { managedSql, operatedIds, type ScopeSql } from './scopeSql';

/*
 * Links are infrastructure: admins read every link, operators the links with an end in one of their
 * neighbourhoods, hosts none (not even a link to the node they host). Managing follows reading.
 */

/** The neighbourhoods of a link's two ends. */
export interface LinkEnds {
  neighbourhoodAId: number;
  neighbourhoodBId: number;
}

export const mayReadLink = (a: Actor, l: LinkEnds) => isAdmin(a) || isOperatorOf(a, l.neighbourhoodAId) || isOperatorOf(a, l.neighbourhoodBId);

export const linkAbilities = (a: Actor, l: LinkEnds) => {
  const manage = mayManage(a, l.neighbourhoodAId) || mayManage(a, l.neighbourhoodBId);
  return { update: manage, delete: manage };
};

/** Adding a link takes managing one of the two radios' nodes. */
export const mayAddLink = (a: Actor, l: LinkEnds) => linkAbilities(a, l).update;

/** For a Link query that includes `radioA.node` and `radioB.node` (required). */
export function linkScope(a: Actor): WhereOptions {
  if (isAdmin(a)) return {};
  const ids = operatedIds(a);
  return { [Op.or]: [{ '$radioA.node.neighbourhood_id$': { [Op.in]: ids } }, { '$radioB.node.neighbourhood_id$': { [Op.in]: ids } }] };
}

/** linkScope for raw SQL, given the neighbourhood-id columns of the two ends' nodes. */
export function linkScopeSql(a: Actor, hoodAColumn = 'na.neighbourhood_id', hoodBColumn = 'nb.neighbourhood_id'): ScopeSql {
  if (isAdmin(a)) return 'true';
  const either = [managedSql(a, hoodAColumn), managedSql(a, hoodBColumn)].filter((s) => s !== 'false');
  return either.length ? `(${either.join(' OR ')})` : 'false';
}
