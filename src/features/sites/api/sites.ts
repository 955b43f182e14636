import type { z } from 'zod';
import type { SiteDto, siteCreateSchema, siteUpdateSchema } from '../../../../shared/schemas/site';
import { neighbourhoodKeys, overviewKeys, siteKeys } from '../../../lib/query-keys';
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
