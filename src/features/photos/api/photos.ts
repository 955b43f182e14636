import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { PhotoDto } from '../../../../shared/schemas/photo';
import { api, formWith } from '../../../lib/api';

export const photoKeys = { site: (siteId: number) => ['sites', 'photos', siteId] as const };

export function useSitePhotos(siteId: number) {
  return useQuery({
    queryKey: photoKeys.site(siteId),
    queryFn: () => api.get<{ data: PhotoDto[]; abilities: { create: boolean } }>(`/sites/${siteId}/photos`),
  });
}

export function useUploadPhoto(siteId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ file, caption }: { file: File; caption: string }) =>
      api.upload<{ data: PhotoDto }>(`/sites/${siteId}/photos`, formWith('photo', file, { caption: caption.trim() || undefined })),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: photoKeys.site(siteId) }),
  });
}

export function useDeletePhoto(siteId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (photoId: number) => api.delete(`/photos/${photoId}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: photoKeys.site(siteId) }),
  });
}
