import { keepPreviousData, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type {
  MaintenanceWindowCreate,
  MaintenanceWindowDto,
  MaintenanceWindowsBody,
  OutboxMessageDto,
  PreferencesDto,
  PreferencesUpdate,
} from '../../../../shared/schemas/alerts';
import { api } from '../../../lib/api';
import { nodeKeys, type ListParams } from '../../../lib/query-keys';
import type { ListResponse } from '../../../lib/resource';

// This feature's query keys, from one factory.
export const alertKeys = {
  outbox: (params: ListParams) => ['outbox', 'list', params] as const,
  outboxAll: ['outbox'] as const,
  preferences: () => ['me', 'preferences'] as const,
  mailInbox: () => ['mail-inbox'] as const,
  maintenance: (nodeId: number) => ['nodes', 'maintenance-windows', nodeId] as const,
};

export function useOutbox(params: ListParams) {
  return useQuery({
    queryKey: alertKeys.outbox(params),
    queryFn: () => api.get<ListResponse<OutboxMessageDto>>('/outbox', params),
    placeholderData: keepPreviousData,
  });
}

export function useRetryMessage() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.post<{ data: OutboxMessageDto }>(`/outbox/${id}/retry`).then((b) => b.data),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: [...alertKeys.outboxAll] }),
  });
}

/** The local mail fake's inbox address; only answers in development (404 elsewhere, which hides the link). */
export function useMailInbox() {
  return useQuery({ queryKey: alertKeys.mailInbox(), queryFn: () => api.get<{ data: { url: string } }>('/mail-inbox').then((b) => b.data), retry: false });
}

export function usePreferences() {
  return useQuery({ queryKey: alertKeys.preferences(), queryFn: () => api.get<{ data: PreferencesDto }>('/me/preferences').then((b) => b.data) });
}

export function useUpdatePreferences() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (patch: PreferencesUpdate) => api.patch<{ data: PreferencesDto }>('/me/preferences', patch).then((b) => b.data),
    onSuccess: (data) => queryClient.setQueryData(alertKeys.preferences(), data),
  });
}

/** `initial`: the same answer carried by another one (the host's /me/nodes) and when that arrived, so the list draws without asking. */
export function useMaintenanceWindows(nodeId: number, initial?: { body: MaintenanceWindowsBody; at: number }) {
  return useQuery({
    queryKey: alertKeys.maintenance(nodeId),
    queryFn: () => api.get<MaintenanceWindowsBody>(`/nodes/${nodeId}/maintenance-windows`),
    initialData: initial?.body,
    initialDataUpdatedAt: initial?.at,
  });
}

// Announcing or cancelling a window can change the node's state, so the node is read again too.
function useInvalidateNode(nodeId: number) {
  const queryClient = useQueryClient();
  return () =>
    Promise.all([alertKeys.maintenance(nodeId), nodeKeys.detail(nodeId)].map((queryKey) => queryClient.invalidateQueries({ queryKey: [...queryKey] })));
}

export function useAnnounceMaintenance(nodeId: number) {
  const invalidate = useInvalidateNode(nodeId);
  return useMutation({
    mutationFn: (body: MaintenanceWindowCreate) => api.post<{ data: MaintenanceWindowDto }>(`/nodes/${nodeId}/maintenance-windows`, body).then((b) => b.data),
    onSuccess: invalidate,
  });
}

export function useCancelMaintenance(nodeId: number) {
  const invalidate = useInvalidateNode(nodeId);
  return useMutation({ mutationFn: (windowId: number) => api.delete(`/nodes/${nodeId}/maintenance-windows/${windowId}`), onSuccess: invalidate });
}
