import type { z } from 'zod';
import type { RadioDto, radioCreateSchema, radioUpdateSchema } from '../../../../shared/schemas/radio';
import { linkKeys, radioKeys } from '../../../lib/query-keys';
import { resourceHooks } from '../../../lib/resource';

type RadioCreate = z.output<typeof radioCreateSchema>;
type RadioUpdate = z.output<typeof radioUpdateSchema>;

// Removing a radio removes its links.
const radios = resourceHooks<RadioDto, RadioCreate, RadioUpdate>('/radios', radioKeys, [linkKeys.all]);

export const useRadios = radios.useList;
export const useRadio = radios.useOne;
export const useCreateRadio = radios.useCreate;
export const useUpdateRadio = radios.useUpdate;
export const useDeleteRadio = radios.useRemove;
