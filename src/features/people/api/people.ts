import type { z } from 'zod';
import type { UserDto, userCreateSchema, userUpdateSchema } from '../../../../shared/schemas/user';
import { neighbourhoodKeys, peopleKeys } from '../../../lib/query-keys';
import { resourceHooks } from '../../../lib/resource';

type PersonCreate = z.output<typeof userCreateSchema>;
type PersonUpdate = z.output<typeof userUpdateSchema>;

// A role change can end an operator's assignments, which neighbourhoods show.
const people = resourceHooks<UserDto, PersonCreate, PersonUpdate>('/users', peopleKeys, [neighbourhoodKeys.all]);

export const usePeople = people.useList;
export const usePerson = people.useOne;
export const useCreatePerson = people.useCreate;
export const useUpdatePerson = people.useUpdate;
