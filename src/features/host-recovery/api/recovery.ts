import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { HostStep } from '../../../../shared/health/hostSteps';
import type { TimelineEntryDto } from '../../../../shared/schemas/outage';
import type { RecoveryDto } from '../../../../shared/schemas/recovery';
import { api } from '../../../lib/api';

export const recoveryKeys = { page: (token: string) => ['recovery', token] as const };

/** The host's page, read with the signed link from the mail (no sign-in). */
export function useRecovery(token: string) {
  return useQuery({
    queryKey: recoveryKeys.page(token),
    queryFn: () => api.get<{ data: RecoveryDto }>('/recovery', { t: token }).then((body) => body.data),
    enabled: token !== '',
    retry: false,
  });
}

export function useRecordStep(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: { step: HostStep; note?: string }) =>
      api.post<{ data: TimelineEntryDto }>('/recovery/host-steps', { t: token, ...input }).then((body) => body.data),
    onSuccess: (entry) => queryClient.setQueryData<RecoveryDto>(recoveryKeys.page(token), (page) => (page ? { ...page, steps: [...page.steps, entry] } : page)),
  });
}
