import { Op, type WhereOptions } from 'sequelize';
import type { Node } from '../models';
import { type Actor, isAdmin, mayManage } from './actor';

/** Admins see every node, operators their neighbourhoods' nodes, hosts the nodes of the sites they host. */
export function nodeScope(a: Actor): WhereOptions {
  if (isAdmin(a)) return {};
  const or: WhereOptions[] = [{ siteId: { [Op.in]: a.hostedSiteIds } }];
  if (a.role === 'operator') or.push({ neighbourhoodId: { [Op.in]: a.neighbourhoodIds } });
  return { [Op.or]: or };
}

export const nodeAbilities = (a: Actor, n: Pick<Node, 'neighbourhoodId'>) => {
  const manage = mayManage(a, n.neighbourhoodId);
  return { update: manage, delete: manage };
};
