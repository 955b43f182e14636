import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ImportKind, ImportPreviewDto, ImportResultDto } from '../../../../shared/schemas/csvImport';
import { api, formWith } from '../../../lib/api';
import { nodeKeys, siteKeys } from '../../../lib/query-keys';

export function usePreviewImport(kind: ImportKind) {
  return useMutation({
    mutationFn: (file: File) => api.upload<{ data: ImportPreviewDto }>(`/imports/${kind}?dryRun=true`, formWith('file', file)).then((r) => r.data),
  });
}

export function useCommitImport(kind: ImportKind) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => api.upload<{ data: ImportResultDto }>(`/imports/${kind}`, formWith('file', file)).then((r) => r.data),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: kind === 'sites' ? siteKeys.all : nodeKeys.all }),
  });
}

export const exportUrl = (table: 'sites' | 'nodes' | 'radios' | 'links') => `/api/v1/exports/${table}.csv`;
