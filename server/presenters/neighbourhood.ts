import type { NeighbourhoodDto, NeighbourhoodSummaryDto } from '../../shared/schemas/neighbourhood';
import type { neighbourhoodSummary } from '../services/neighbourhoods';
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

type Summary = Awaited<ReturnType<typeof neighbourhoodSummary>>;

/** Hosts are named only for sites the caller may read; operators by name only. */
export function presentNeighbourhoodSummary(s: Summary): NeighbourhoodSummaryDto {
  return {
    availability: s.availability.pooled,
    nodes: s.nodes.map((x) => ({
      id: x.id,
      name: x.name,
      state: x.state,
      siteId: x.siteId,
      siteName: s.siteNames.get(x.siteId) ?? '',
      availability: s.availability.byNode(x.id),
    })),
    operators: s.operators.map((o) => ({ id: o.id, name: o.name })),
    hosts: s.sites.map((site) => ({ siteId: site.id, siteName: site.name, host: site.host ? { id: site.host.id, name: site.host.name } : null })),
  };
}
