import { useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import type { SiteDto, siteCreateSchema, siteUpdateSchema } from '../../../../shared/schemas/site';
import { neighbourhoodKeys, overviewKeys, siteKeys } from '../../../lib/query-keys';
import { api } from '../../../lib/api';
import { resourceHooks } from '../../../lib/resource';

type SiteCreate = z.output<typeof siteCreateSchema>;
type SiteUpdate = z.output<typeof siteUpdateSchema>;

// A site's count shows on the overview and on its neighbourhood.
const sites = resourceHooks<SiteDto, SiteCreate, SiteUpdate>('/sites', siteKeys, [overviewKeys.all, neighbourhoodKeys.all]);

export const useSites = sites.useList;
export const useSite = sites.useOne;
export const useCreateSite = sites.useCreate;
export const useUpdateSite = sites.useUpdate;
export const useDeleteSite = sites.useRemove;

/** People the signed-in admin or operator may name as a site's host (the server decides who). */
export function useHostCandidates(enabled: boolean) {
  return useQuery({
    queryKey: [...siteKeys.all, 'host-candidates'] as const,
    queryFn: () => api.get<{ data: { id: number; name: string }[] }>('/sites/host-candidates'),
    enabled,
  });
}
