import { Op, type WhereOptions } from 'sequelize';
import type { Site } from '../models';
import { type Actor, isAdmin, isHostOfSite, isOperatorOf, mayManage } from './actor';
import { column, intArray, operatedIds, type ScopeSql } from './scopeSql';

/** Admins see every site, operators their neighbourhoods' sites, everyone the sites they host. */
export function siteScope(a: Actor): WhereOptions {
  if (isAdmin(a)) return {};
  const or: WhereOptions[] = [{ id: { [Op.in]: a.hostedSiteIds } }];
  if (a.role === 'operator') or.push({ neighbourhoodId: { [Op.in]: a.neighbourhoodIds } });
  return { [Op.or]: or };
}

export const mayReadSite = (a: Actor, s: Pick<Site, 'id' | 'neighbourhoodId'>) => isAdmin(a) || isOperatorOf(a, s.neighbourhoodId) || isHostOfSite(a, s.id);

/** siteScope for raw SQL over `sites <alias>` (no bind parameters; see nodeScopeSql). */
export function siteScopeSql(a: Actor, alias = 's'): ScopeSql {
  if (isAdmin(a)) return 'true';
  const or = a.hostedSiteIds.length ? [`${column(alias, 'id')} = ANY(${intArray(a.hostedSiteIds)})`] : [];
  const hoods = operatedIds(a);
  if (hoods.length) or.push(`${column(alias, 'neighbourhood_id')} = ANY(${intArray(hoods)})`);
  return or.length ? `(${or.join(' OR ')})` : 'false';
}

export const siteAbilities = (a: Actor, s: Pick<Site, 'neighbourhoodId'>) => {
  const manage = mayManage(a, s.neighbourhoodId);
  return { update: manage, delete: manage };
};
export const mayCreateSiteIn = (a: Actor, neighbourhoodId: number) => mayManage(a, neighbourhoodId);
/** Host contact details: admins, the neighbourhood's operators, and the host themself. */
export const maySeeHostContact = (a: Actor, s: Pick<Site, 'neighbourhoodId' | 'hostUserId'>) => mayManage(a, s.neighbourhoodId) || s.hostUserId === a.id;
