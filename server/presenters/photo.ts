import type { PhotoDto } from '../../shared/schemas/photo';
import type { Photo } from '../models/photo';
import { iso } from './common';

/** The storage key and the uploader stay on the server; files are reached through the photo's id. */
export function presentPhoto(p: Photo, abilities: { delete: boolean }): PhotoDto {
  return {
    id: p.id,
    siteId: p.siteId,
    contentType: p.contentType,
    sizeBytes: p.sizeBytes,
    widthPx: p.widthPx ?? null,
    heightPx: p.heightPx ?? null,
    caption: p.caption ?? null,
    createdAt: iso(p.createdAt)!,
    url: `/api/v1/photos/${p.id}`,
    thumbnailUrl: `/api/v1/photos/${p.id}/thumbnail`,
    abilities,
  };
}
