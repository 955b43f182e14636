import { useQuery } from '@tanstack/react-query';
import type { PublicStatusDto } from '../../../../shared/schemas/publicStatus';
import { api } from '../../../lib/api';

export const publicStatusKeys = { current: () => ['public-status'] as const };

/** Refreshed every minute while open; the server shares one answer among everyone for a few seconds. */
export function usePublicStatus() {
  return useQuery({
    queryKey: publicStatusKeys.current(),
    queryFn: () => api.get<{ data: PublicStatusDto }>('/public/status').then((r) => r.data),
    refetchInterval: 60_000,
  });
}
