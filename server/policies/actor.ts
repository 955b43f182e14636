import { Op } from 'sequelize';
import type { Role } from '../../shared/enums';
import { Node, OperatorAssignment, Site, User } from '../models';

/** Who is acting, with the scopes every policy needs, loaded once per request. */
export interface Actor {
  id: number;
  email: string;
  name: string;
  role: Role;
  /** Neighbourhoods an operator is assigned to (empty for others). */
  neighbourhoodIds: number[];
  /** Sites this person hosts, whatever their role. */
  hostedSiteIds: number[];
  /** Neighbourhoods of the hosted sites. */
  hostedNeighbourhoodIds: number[];
}

export async function loadActor(userId: number): Promise<Actor | null> {
  const user = await User.findByPk(userId);
  if (!user || !user.active) return null;
  const [assignments, hosted] = await Promise.all([
    user.role === 'operator' ? OperatorAssignment.findAll({ where: { userId } }) : Promise.resolve([]),
    Site.findAll({ where: { hostUserId: userId }, attributes: ['id', 'neighbourhoodId'] }),
  ]);
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    neighbourhoodIds: assignments.map((a) => a.neighbourhoodId),
    hostedSiteIds: hosted.map((s) => s.id),
    hostedNeighbourhoodIds: [...new Set(hosted.map((s) => s.neighbourhoodId))],
  };
}

export const isAdmin = (a: Actor) => a.role === 'admin';
export const isOperatorOf = (a: Actor, neighbourhoodId: number) => a.role === 'operator' && a.neighbourhoodIds.includes(neighbourhoodId);
/** Admins and the operators of a neighbourhood may change what is in it. */
export const mayManage = (a: Actor, neighbourhoodId: number) => isAdmin(a) || isOperatorOf(a, neighbourhoodId);
/** Admins and operators with at least one neighbourhood may add inventory somewhere (the create buttons). */
export const operatesAny = (a: Actor) => isAdmin(a) || (a.role === 'operator' && a.neighbourhoodIds.length > 0);
export const isHostOfSite = (a: Actor, siteId: number) => a.hostedSiteIds.includes(siteId);
export const isHostOfNode = (a: Actor, node: Pick<Node, 'siteId'>) => isHostOfSite(a, node.siteId);

/** A where-clause that matches nothing, for scopes that are empty. */
export const NOTHING = { id: { [Op.eq]: null } } as const;
