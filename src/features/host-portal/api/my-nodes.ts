import { useQuery } from '@tanstack/react-query';
import type { HostedSiteDto } from '../../../../shared/schemas/account';
import { api } from '../../../lib/api';
import { accountKeys } from '../../../lib/query-keys';

export function useMyNodes() {
  return useQuery({
    queryKey: accountKeys.myNodes(),
    queryFn: () => api.get<{ data: HostedSiteDto[]; timeZone: string }>('/me/nodes'),
    refetchInterval: 60_000, // a host keeps this open on a phone; a minute is fresh enough
  });
}
