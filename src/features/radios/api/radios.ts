import type { z } from 'zod';
import type { RadioDto, radioCreateSchema, radioUpdateSchema } from '../../../../shared/schemas/radio';
import { linkKeys, radioKeys, topologyKeys } from '../../../lib/query-keys';
import { resourceHooks } from '../../../lib/resource';

type RadioCreate = z.output<typeof radioCreateSchema>;
type RadioUpdate = z.output<typeof radioUpdateSchema>;

// Removing a radio removes its links; its power and gain move the links' predicted margin on the map.
const radios = resourceHooks<RadioDto, RadioCreate, RadioUpdate>('/radios', radioKeys, [linkKeys.all, topologyKeys.all]);

export const useRadios = radios.useList;
export const useRadio = radios.useOne;
export const useCreateRadio = radios.useCreate;
export const useUpdateRadio = radios.useUpdate;
export const useDeleteRadio = radios.useRemove;
