import type { NeighbourhoodDto } from '../../shared/schemas/neighbourhood';
import type { Neighbourhood } from '../models';
import type { Actor } from '../policies/actor';
import { neighbourhoodAbilities } from '../policies/neighbourhood';
import { iso } from './common';

export interface NeighbourhoodCounts {
  operatorIds: number[];
  siteCount: number;
  nodeCount: number;
}

export function presentNeighbourhood(n: Neighbourhood, counts: NeighbourhoodCounts, actor: Actor): NeighbourhoodDto {
  return {
    id: n.id,
    name: n.name,
    description: n.description ?? null,
    operatorIds: counts.operatorIds,
    siteCount: counts.siteCount,
    nodeCount: counts.nodeCount,
    retiredAt: iso(n.retiredAt) ?? null,
    createdAt: iso(n.createdAt)!,
    updatedAt: iso(n.updatedAt)!,
    abilities: neighbourhoodAbilities(actor, n),
  };
}
