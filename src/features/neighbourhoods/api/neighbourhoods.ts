import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { NeighbourhoodDto, NeighbourhoodSummaryDto, neighbourhoodCreateSchema, neighbourhoodUpdateSchema } from '../../../../shared/schemas/neighbourhood';
import type { NodeDto } from '../../../../shared/schemas/node';
import { api } from '../../../lib/api';
import { type ListParams, neighbourhoodKeys, neighbourhoodSummaryKeys, nodeKeys, overviewKeys, peopleKeys } from '../../../lib/query-keys';
import { listQuery, resourceHooks } from '../../../lib/resource';

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
    mutationFn: (userIds: number[]) => api.put<{ data: NeighbourhoodDto }>(`/neighbourhoods/${id}/operators`, { userIds }).then((body) => body.data),
    onSuccess: async (data) => {
      queryClient.setQueryData(neighbourhoodKeys.detail(id), data);
      // Each person's record lists their neighbourhoods too.
      await Promise.all([queryClient.invalidateQueries({ queryKey: neighbourhoodKeys.all }), queryClient.invalidateQueries({ queryKey: peopleKeys.all })]);
    },
  });
}

export function useNeighbourhoodSummary(id: number) {
  return useQuery({
    queryKey: neighbourhoodSummaryKeys.one(id),
    queryFn: () => api.get<{ data: NeighbourhoodSummaryDto }>(`/neighbourhoods/${id}/summary`).then((b) => b.data),
  });
}

/** Move nodes into this neighbourhood (admins); every list that groups nodes by neighbourhood changes. */
export function useAssignNodes(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (nodeIds: number[]) => api.post<{ data: { moved: number; unchanged: number } }>(`/neighbourhoods/${id}/nodes`, { nodeIds }).then((b) => b.data),
    onSuccess: () =>
      Promise.all([neighbourhoodKeys.all, nodeKeys.all, overviewKeys.all].map((queryKey) => queryClient.invalidateQueries({ queryKey: [...queryKey] }))),
  });
}

/** Candidate nodes for the bulk move: the same list the nodes page reads, filtered on the server. */
export function useNodeCandidates(params: ListParams) {
  return useQuery({ ...listQuery<NodeDto>('/nodes', nodeKeys, params), placeholderData: keepPreviousData });
}
