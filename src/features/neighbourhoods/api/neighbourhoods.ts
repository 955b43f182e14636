import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { NeighbourhoodDto, neighbourhoodCreateSchema, neighbourhoodUpdateSchema } from '../../../../shared/schemas/neighbourhood';
import { api } from '../../../lib/api';
import { neighbourhoodKeys, overviewKeys, peopleKeys } from '../../../lib/query-keys';
import { resourceHooks } from '../../../lib/resource';

type NeighbourhoodCreate = z.output<typeof neighbourhoodCreateSchema>;
type NeighbourhoodUpdate = z.output<typeof neighbourhoodUpdateSchema>;

const neighbourhoods = resourceHooks<NeighbourhoodDto, NeighbourhoodCreate, NeighbourhoodUpdate>('/neighbourhoods', neighbourhoodKeys, [overviewKeys.all]);

export const useNeighbourhoods = neighbourhoods.useList;
export const useNeighbourhood = neighbourhoods.useOne;
export const useCreateNeighbourhood = neighbourhoods.useCreate;
export const useUpdateNeighbourhood = neighbourhoods.useUpdate;
export const useDeleteNeighbourhood = neighbourhoods.useRemove;

/** Replace the operators assigned to a neighbourhood (admins). */
export function useAssignOperators(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userIds: number[]) =>
      api.put<{ data: NeighbourhoodDto }>(`/neighbourhoods/${id}/operators`, { userIds }).then((body) => body.data),
    onSuccess: async (data) => {
      queryClient.setQueryData(neighbourhoodKeys.detail(id), data);
      // Each person's record lists their neighbourhoods too.
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: neighbourhoodKeys.all }),
        queryClient.invalidateQueries({ queryKey: peopleKeys.all }),
      ]);
    },
  });
}
