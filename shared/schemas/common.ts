import { z } from 'zod';

/** A positive integer id taken from a path or a body. */
export const idSchema = z.coerce.number({ error: 'must be a number' }).int('must be a whole number').positive('must be a positive id');

export const idParamsSchema = z.object({ id: idSchema });

/** Text that will appear in mail headers and pages: no control characters, trimmed. */
export const nameSchema = z
  .string({ error: (issue) => (issue.input === undefined ? 'is required' : 'must be text') })
  .trim()
  .min(1, 'must not be empty')
  .max(120, 'must be at most 120 characters')
  .refine((s) => !/[\u0000-\u001f\u007f]/.test(s), 'must not contain control characters or line breaks');

export const notesSchema = z.string().trim().max(2000, 'must be at most 2000 characters');

/** `page`, `pageSize` (default 50, max 500) and `sort=field|-field`, as API.md fixes them. */
export const listQuerySchema = z.object({
  page: z.coerce.number().int('must be a whole number').min(1, 'must be 1 or more').default(1),
  pageSize: z.coerce.number().int('must be a whole number').min(1, 'must be 1 or more').max(500, 'must be at most 500').default(50),
  sort: z
    .string()
    .regex(/^-?[A-Za-z][A-Za-z0-9]*$/, 'must be a field name, optionally prefixed with -')
    .optional(),
  q: z.string().trim().max(120, 'must be at most 120 characters').optional(),
});
export type ListQuery = z.infer<typeof listQuerySchema>;

export interface Pagination {
  page: number;
  pageSize: number;
  total: number;
}

export interface ListEnvelope<T> {
  data: T[];
  pagination: Pagination;
}

export interface ErrorBody {
  error: { code: string; message: string; details?: { path: string; message: string }[] };
}

/** What the caller may do with a record; the UI gates buttons from this, never its own rules. */
export interface Abilities {
  update: boolean;
  delete: boolean;
}
