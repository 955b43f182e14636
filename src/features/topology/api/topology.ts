import { useMutation, useQuery, useQueryClient, type QueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { linkKeys, overviewKeys, topologyKeys } from '../../../lib/query-keys';
import type { RadioMove } from '../../../../shared/schemas/radio';
import type { DiscoveredLinkDto, TopologyDto, TopologyLinkDto, TopologyNeighbourhoodDto, TopologyNodeDto } from '../../../../shared/schemas/topology';

export type { RadioMove };

/** The map's graph as the server answers it: the types live with the contract in shared/schemas/topology.ts. */
export type TopologyNode = TopologyNodeDto;
export type TopologyLink = TopologyLinkDto;
export type DiscoveredLink = DiscoveredLinkDto;
export type Topology = TopologyDto;

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
