import { useQuery } from '@tanstack/react-query';
import type { NodeState } from '../../../../shared/enums';
import { api } from '../../../lib/api';
import { overviewKeys } from '../../../lib/query-keys';

export interface Overview {
  countsByState: Record<NodeState, number>;
  nodeCount: number;
  siteCount: number;
  neighbourhoodCount: number;
  openOutages: OpenOutage[];
  driftNodes: DriftNode[];
  weakestLinks: WeakLink[];
  /** Listed links whose ends' MACs are known but that nobody has heard for a day. */
  silentLinks?: SilentLink[];
  /** Pairs the reports show talking that the inventory does not list (drawn on the map). */
  discoveredLinkCount?: number;
  radioMoves?: {
    id: number;
    mac: string;
    fromNodeId: number;
    fromNodeName: string;
    fromIface: string;
    toNodeId: number;
    toNodeName: string;
    toIface: string;
    at: string;
  }[];
}

export interface SilentLink {
  id: number;
  name: string | null;
  status: 'planned' | 'live';
  nodeAId: number;
  nodeAName: string;
  nodeBId: number;
  nodeBName: string;
  lastObservedAt: string | null;
}

export interface WeakLink {
  id: number;
  nodeAId: number;
  nodeAName: string;
  nodeBId: number;
  nodeBName: string;
  fadeMarginDb: number;
  predictedSignalDbm: number | null;
  measuredSignalDbm: number | null;
}

export interface OpenOutage {
  id: number;
  nodeId: number;
  nodeName: string;
  neighbourhoodId: number;
  startedAt: string;
  acknowledged: boolean;
  /** Nodes cut off behind this outage, and the clients they were serving at their last report. */
  blastNodeCount?: number;
  blastClients?: number;
}

export interface DriftNode {
  id: number;
  name: string;
  drift: { field: string; expected: unknown; reported: unknown }[];
}

export function useOverview() {
  return useQuery({
    queryKey: overviewKeys.summary(),
    queryFn: () => api.get<{ data: Overview }>('/overview').then((body) => body.data),
  });
}
