import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { OutageDto } from '../../../../shared/schemas/outage';
import { api } from '../../../lib/api';
import { outageKeys, overviewKeys, type ListParams } from '../../../lib/query-keys';
import type { ListResponse } from '../../../lib/resource';

export function useOutages(params: ListParams, options: { enabled?: boolean } = {}) {
  return useQuery({
    queryKey: outageKeys.list(params),
    queryFn: () => api.get<ListResponse<OutageDto>>('/outages', params),
    placeholderData: keepPreviousData,
    enabled: options.enabled ?? true,
  });
}

/** One outage with its timeline (opened, acknowledged, notes, the host's steps, closed); socket events refresh it. */
export function useOutage(outageId: number) {
  return useQuery({
    queryKey: outageKeys.detail(outageId),
    queryFn: () => api.get<{ data: OutageDto }>(`/outages/${outageId}`).then((body) => body.data),
  });
}

// Acknowledging moves the overview's open-outage list too.
function useInvalidateOutages() {
  const queryClient = useQueryClient();
  return () => Promise.all([outageKeys.all, overviewKeys.all].map((queryKey) => queryClient.invalidateQueries({ queryKey: [...queryKey] })));
}

export function useAcknowledgeOutage() {
  const invalidate = useInvalidateOutages();
  return useMutation({
    mutationFn: (outageId: number) => api.post<{ data: OutageDto }>(`/outages/${outageId}/acknowledge`).then((body) => body.data),
    onSuccess: invalidate,
  });
}

export function useUpdateOutageNotes(outageId: number) {
  const invalidate = useInvalidateOutages();
  return useMutation({
    mutationFn: (notes: string) => api.patch<{ data: OutageDto }>(`/outages/${outageId}`, { notes }).then((body) => body.data),
    onSuccess: invalidate,
  });
}
