import { useQuery } from '@tanstack/react-query';
import type { NodeState } from '../../../../shared/enums';
import { api } from '../../../lib/api';
import { overviewKeys } from '../../../lib/query-keys';

export interface Overview {
  countsByState: Record<NodeState, number>;
  nodeCount: number;
  siteCount: number;
  neighbourhoodCount: number;
  openOutages: unknown[];
}

export function useOverview() {
  return useQuery({
    queryKey: overviewKeys.summary(),
    queryFn: () => api.get<{ data: Overview }>('/overview').then((body) => body.data),
  });
}
