import { z } from 'zod';
import { NODE_STATES, type LinkStatus, type NodeState } from '../enums';
import type { RadioMove } from './radio';

/** GET /api/topology: the map's graph, as the server answers it (server/presenters/topology.ts). */
export interface TopologyNodeDto {
  id: number;
  name: string;
  siteId: number;
  siteName: string;
  neighbourhoodId: number;
  latitude: number;
  longitude: number;
  state: NodeState;
  isUplink: boolean;
  lastSeenAt: string | null;
  openOutageId: number | null;
  /** On a stranded node: the open outage of the root it is cut off behind (null when the cut contains Parapet's own side). */
  strandedBy: number | null;
  /** On the root of an open outage: how many nodes sit behind it. */
  blastNodeCount: number;
}

export interface TopologyLinkDto {
  id: number;
  name: string | null;
  status: LinkStatus;
  nodeAId: number;
  nodeBId: number;
  distanceKm: number | null;
  predictedSignalDbm: number | null;
  fadeMarginDb: number | null;
  expectedRateMbps: number | null;
  measuredSignalDbm: number | null;
  /** A report named the other end as its peer within the observed window. */
  observed: boolean;
  observedSignalDbm: number | null;
  lastObservedAt: string | null;
  /** At least one end's MAC known, yet nobody has named the other end for the silent window. */
  plannedButSilent: boolean;
}

/** Two radios the reports show talking to each other, with no link in the inventory. */
export interface DiscoveredLinkDto {
  nodeAId: number;
  nodeBId: number;
  radioAId: number;
  radioBId: number;
  signalDbm: number | null;
  lastSeenAt: string;
  abilities: { add: boolean };
}

export interface TopologyDto {
  nodes: TopologyNodeDto[];
  links: TopologyLinkDto[];
  discoveredLinks: DiscoveredLinkDto[];
  radioMoves: RadioMove[];
}

/**
 * GET /api/v1/topology/neighbourhoods: per readable neighbourhood how many of the caller's readable nodes are
 * in each state, and where its sites are on average; small, so the map's marks draw before the graph arrives.
 */
export const topologyNeighbourhoodSchema = z.object({
  neighbourhoodId: z.number().int(),
  name: z.string(),
  total: z.number().int().nonnegative(),
  counts: z.object(Object.fromEntries(NODE_STATES.map((s) => [s, z.number().int().nonnegative()])) as Record<NodeState, z.ZodNumber>),
  /** The mean of its readable nodes' site coordinates, in degrees. */
  latitude: z.number(),
  longitude: z.number(),
});
export const topologyNeighbourhoodsResponseSchema = z.object({ data: z.array(topologyNeighbourhoodSchema) });
export type TopologyNeighbourhoodDto = z.infer<typeof topologyNeighbourhoodSchema>;
