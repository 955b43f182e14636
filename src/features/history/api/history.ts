import { keepPreviousData, useQuery } from '@tanstack/react-query';
import type { HistoryEntryDto } from '../../../../shared/schemas/account';
import type { ListEnvelope } from '../../../../shared/schemas/common';
import { api } from '../../../lib/api';
import { historyKeys, type ListParams } from '../../../lib/query-keys';

export function useHistory(params: ListParams) {
  return useQuery({
    queryKey: historyKeys.list(params),
    queryFn: () => api.get<ListEnvelope<HistoryEntryDto>>('/history', params),
    placeholderData: keepPreviousData,
  });
}
