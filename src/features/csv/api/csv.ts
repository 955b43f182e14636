import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ImportKind, ImportPreviewDto, ImportResultDto } from '../../../../shared/schemas/csvImport';
import { postForm } from '../../../lib/form-upload';
import { nodeKeys, siteKeys } from '../../../lib/query-keys';

const formOf = (file: File) => {
  const form = new FormData();
  form.append('file', file);
  return form;
};

export function usePreviewImport(kind: ImportKind) {
  return useMutation({
    mutationFn: (file: File) => postForm<{ data: ImportPreviewDto }>(`/imports/${kind}?dryRun=true`, formOf(file)).then((r) => r.data),
  });
}

export function useCommitImport(kind: ImportKind) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (file: File) => postForm<{ data: ImportResultDto }>(`/imports/${kind}`, formOf(file)).then((r) => r.data),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: kind === 'sites' ? siteKeys.all : nodeKeys.all }),
  });
}

export const exportUrl = (table: 'sites' | 'nodes' | 'radios' | 'links') => `/api/v1/exports/${table}.csv`;
