import { useQuery } from '@tanstack/react-query';
import type { NodeDto } from '../../shared/schemas/node';
import type { RadioDto } from '../../shared/schemas/radio';
import type { SiteDto } from '../../shared/schemas/site';
import { nodeKeys, radioKeys, siteKeys } from './query-keys';
import { listQuery, rowsOf } from './resource';

// Pickers of sites, nodes and radios used by several features (planning's link ends, the link form).
// They read the inventory's own list queries and narrow the envelope to rows with `select`.
const ALL = { page: 1, pageSize: 500, sort: 'name' } as const;

export const useSiteChoices = () => useQuery({ ...listQuery<SiteDto>('/sites', siteKeys, ALL), select: rowsOf });

export const useNodeChoices = (siteId?: number) => {
  const params = { ...ALL, ...(siteId ? { siteId } : {}) };
  return useQuery({ ...listQuery<NodeDto>('/nodes', nodeKeys, params), select: rowsOf });
};

export const useRadioChoices = (nodeId: number | null) => {
  const params = { page: 1, pageSize: 500, sort: 'iface', nodeId: nodeId ?? undefined };
  return useQuery({ ...listQuery<RadioDto>('/radios', radioKeys, params), select: rowsOf, enabled: nodeId !== null });
};
