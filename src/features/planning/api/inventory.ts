import { useQuery } from '@tanstack/react-query';
import type { LinkDto } from '../../../../shared/schemas/link';
import type { NodeDto } from '../../../../shared/schemas/node';
import type { RadioDto } from '../../../../shared/schemas/radio';
import type { SiteDto } from '../../../../shared/schemas/site';
import { linkKeys, nodeKeys, radioKeys, siteKeys } from '../../../lib/query-keys';
import { listQuery, rowsOf } from '../../../lib/resource';

// The inventory pickers of the planning pages read the same endpoints and keys as the inventory pages,
// so they share the list query (the envelope under the key) and narrow it to rows with `select`.
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

export const useLiveLinks = () => {
  const params = { page: 1, pageSize: 500, sort: 'name', status: 'live' };
  return useQuery({ ...listQuery<LinkDto>('/links', linkKeys, params), select: rowsOf });
};
