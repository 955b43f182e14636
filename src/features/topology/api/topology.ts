import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { LinkStatus, NodeState } from '../../../../shared/enums';
import { api } from '../../../lib/api';
import { linkKeys, overviewKeys, topologyKeys } from '../../../lib/query-keys';
import type { RadioMove } from '../../../../shared/schemas/radio';
import type { TopologyNeighbourhoodDto } from '../../../../shared/schemas/topology';

export type { RadioMove };

export interface TopologyNode {
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
  /** On a stranded node: the open outage upstream that cuts it off. */
  strandedBy?: number | null;
  /** On the node of an open outage: how many nodes are cut off behind it. */
  blastNodeCount?: number;
}

export interface TopologyLink {
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
  /** A report named the other end as its peer within the last 15 minutes. */
  observed?: boolean;
  observedSignalDbm?: number | null;
  lastObservedAt?: string | null;
  /** At least one end's MAC known, yet nobody has named the other end for a day. */
  plannedButSilent?: boolean;
}

/** Two radios the reports show talking to each other, with no link in the inventory. */
export interface DiscoveredLink {
  nodeAId: number;
  nodeBId: number;
  radioAId: number;
  radioBId: number;
  signalDbm: number | null;
  lastSeenAt: string;
  abilities?: { add: boolean };
}

export interface Topology {
  nodes: TopologyNode[];
  links: TopologyLink[];
  discoveredLinks?: DiscoveredLink[];
  radioMoves?: RadioMove[];
}

/** "Add to the inventory": a live link between the two radios the air shows talking. */
export function useAddDiscoveredLink() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (d: DiscoveredLink) => api.post<{ data: { id: number } }>('/links', { radioAId: d.radioAId, radioBId: d.radioBId, status: 'live' }),
    onSuccess: () =>
      Promise.all([topologyKeys.all, linkKeys.all, overviewKeys.all].map((queryKey) => queryClient.invalidateQueries({ queryKey: [...queryKey] }))),
  });
}

export type TopologyNeighbourhood = TopologyNeighbourhoodDto;

/** Per neighbourhood the node count per state: small and quick, drawn while the whole graph loads. */
export function useTopologyNeighbourhoods(enabled = true) {
  return useQuery({
    queryKey: [...topologyKeys.all, 'neighbourhoods'],
    queryFn: () => api.get<{ data: TopologyNeighbourhood[] }>('/topology/neighbourhoods').then((body) => body.data),
    enabled,
  });
}

export function useTopology() {
  return useQuery({
    queryKey: topologyKeys.graph(),
    queryFn: () => api.get<{ data: Topology }>('/topology').then((body) => body.data),
    // Live events keep it current; a refetch on every visit would redraw 2,000 nodes for nothing.
    staleTime: 5 * 60_000,
  });
}

export type TopologyNodePatch = Partial<Pick<TopologyNode, 'state' | 'lastSeenAt' | 'openOutageId'>>;

/**
 * Applies several nodes' changes in one pass. Untouched nodes keep their object identity,
 * so the graph re-renders only the nodes that changed.
 */
export function patchTopologyNodes(queryClient: QueryClient, patches: Map<number, TopologyNodePatch>) {
  if (patches.size === 0) return;
  queryClient.setQueryData<Topology>(topologyKeys.graph(), (old) => {
    if (!old) return old;
    let changed = false;
    const nodes = old.nodes.map((node) => {
      const patch = patches.get(node.id);
      if (!patch) return node;
      const next = { ...node, ...patch };
      if (next.state === node.state && next.lastSeenAt === node.lastSeenAt && next.openOutageId === node.openOutageId) return node;
      changed = true;
      return next;
    });
    return changed ? { ...old, nodes } : old;
  });
}
