import type { z } from 'zod';
import type { LinkDto, linkCreateSchema, linkUpdateSchema } from '../../../../shared/schemas/link';
import { linkKeys, topologyKeys } from '../../../lib/query-keys';
import { resourceHooks } from '../../../lib/resource';

type LinkCreate = z.output<typeof linkCreateSchema>;
type LinkUpdate = z.output<typeof linkUpdateSchema>;

// Links are drawn on the map with their predicted margin.
const links = resourceHooks<LinkDto, LinkCreate, LinkUpdate>('/links', linkKeys, [topologyKeys.all]);

export const useLinks = links.useList;
export const useLink = links.useOne;
export const useCreateLink = links.useCreate;
export const useUpdateLink = links.useUpdate;
export const useDeleteLink = links.useRemove;
