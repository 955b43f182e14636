import { Op, type WhereOptions } from 'sequelize';
import type { Neighbourhood } from '../models';
import { type Actor, isAdmin } from './actor';

export function neighbourhoodScope(a: Actor): WhereOptions {
  if (isAdmin(a)) return {};
  const ids = a.role === 'operator' ? [...new Set([...a.neighbourhoodIds, ...a.hostedNeighbourhoodIds])] : a.hostedNeighbourhoodIds;
  return { id: { [Op.in]: ids } };
}

export const neighbourhoodAbilities = (a: Actor, _n?: Neighbourhood) => ({ update: isAdmin(a), delete: isAdmin(a) });
export const mayCreateNeighbourhood = isAdmin;
