import { useQuery } from '@tanstack/react-query';
import type { LinkDto } from '../../../../shared/schemas/link';
import type { NodeDto } from '../../../../shared/schemas/node';
import type { RadioDto } from '../../../../shared/schemas/radio';
import type { SiteDto } from '../../../../shared/schemas/site';
import { api } from '../../../lib/api';
import { linkKeys, nodeKeys, radioKeys, siteKeys } from '../../../lib/query-keys';
import type { ListResponse } from '../../../lib/resource';

// The inventory pickers of the planning pages read the same endpoints and keys as the inventory pages.
const ALL = { page: 1, pageSize: 500, sort: 'name' } as const;

export const useSiteChoices = () =>
  useQuery({ queryKey: siteKeys.list(ALL), queryFn: () => api.get<ListResponse<SiteDto>>('/sites', ALL).then((b) => b.data) });

export const useNodeChoices = (siteId?: number) => {
  const params = { ...ALL, ...(siteId ? { siteId } : {}) };
  return useQuery({ queryKey: nodeKeys.list(params), queryFn: () => api.get<ListResponse<NodeDto>>('/nodes', params).then((b) => b.data) });
};

export const useRadioChoices = (nodeId: number | null) => {
  const params = { page: 1, pageSize: 500, sort: 'iface', nodeId: nodeId ?? undefined };
  return useQuery({ queryKey: radioKeys.list(params), queryFn: () => api.get<ListResponse<RadioDto>>('/radios', params).then((b) => b.data), enabled: nodeId !== null });
};

export const useLiveLinks = () => {
  const params = { page: 1, pageSize: 500, sort: 'name', status: 'live' };
  return useQuery({ queryKey: linkKeys.list(params), queryFn: () => api.get<ListResponse<LinkDto>>('/links', params).then((b) => b.data) });
};
