import { z } from 'zod';

export const photoCaptionSchema = z.object({
  caption: z
    .string()
    .trim()
    .max(200, 'must be at most 200 characters')
    // eslint-disable-next-line no-control-regex -- control characters are what this check refuses
    .refine((s) => !/[\u0000-\u001f\u007f]/.test(s), 'must not contain control characters or line breaks')
    .optional(),
});

export interface PhotoDto {
  id: number;
  siteId: number;
  contentType: 'image/jpeg' | 'image/png' | 'image/webp';
  sizeBytes: number;
  widthPx: number | null;
  heightPx: number | null;
  caption: string | null;
  createdAt: string;
  url: string;
  thumbnailUrl: string;
  abilities: { delete: boolean };
}
