import { z } from 'zod';

/** Ids are PostgreSQL `integer`s: nothing above this exists. */
export const MAX_ID = 2_147_483_647;

/** A positive integer id taken from a path or a body. */
export const idSchema = z.coerce
  .number({ error: 'must be a number' })
  .int('must be a whole number')
  .positive('must be a positive id')
  .max(MAX_ID, `must be at most ${MAX_ID}; no record has a larger id`);

export const idParamsSchema = z.object({ id: idSchema });

// C0 and C1 control characters (line breaks included) and DEL.
// eslint-disable-next-line no-control-regex -- these are the characters input is refused for
const CONTROL = /[\u0000-\u001f\u007f-\u009f]/;
// The same, but tabs and line breaks are fine in multi-line notes.
// eslint-disable-next-line no-control-regex -- these are the characters input is refused for
const CONTROL_BUT_LINES = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\u007f-\u009f]/;
// Unicode Bidirectional Algorithm (UAX #9 §2) embeddings, overrides and isolates: they reorder how
// the surrounding text is shown, so "gnp.exe" can read as "exe.png" in a page or a mail.
const BIDI_CONTROL = /[\u202a-\u202e\u2066-\u2069]/;
export const NO_CONTROL = 'must not contain control characters or line breaks';
export const NO_BIDI = 'must not contain text-direction control characters (U+202A–U+202E, U+2066–U+2069)';

/** Whether text holds a character that would change how it is shown: control or text-direction characters. */
export const hasHiddenCharacters = (s: string, allowLines = false) => (allowLines ? CONTROL_BUT_LINES : CONTROL).test(s) || BIDI_CONTROL.test(s);

/** One line of plain text up to `max` characters: trimmed, no control or text-direction characters. */
export const lineSchema = (max: number) =>
  z
    .string({ error: (issue) => (issue.input === undefined ? 'is required' : 'must be text') })
    .trim()
    .max(max, `must be at most ${max} characters`)
    .refine((s) => !CONTROL.test(s), NO_CONTROL)
    .refine((s) => !BIDI_CONTROL.test(s), NO_BIDI);

/** Text that will appear in mail headers and pages: no control or text-direction characters, trimmed. */
export const nameSchema = z
  .string({ error: (issue) => (issue.input === undefined ? 'is required' : 'must be text') })
  .trim()
  .min(1, 'must not be empty')
  .max(120, 'must be at most 120 characters')
  .refine((s) => !CONTROL.test(s), NO_CONTROL)
  .refine((s) => !BIDI_CONTROL.test(s), NO_BIDI);

/** Multi-line notes: line breaks and tabs allowed, other control and text-direction characters not. */
export const notesSchema = z
  .string({ error: 'must be text' })
  .trim()
  .max(2000, 'must be at most 2000 characters')
  .refine((s) => !CONTROL_BUT_LINES.test(s), 'must not contain control characters other than line breaks and tabs')
  .refine((s) => !BIDI_CONTROL.test(s), NO_BIDI);

/** `page`, `pageSize` (default 50, max 500) and `sort=field|-field`, as API.md fixes them. */
export const listQuerySchema = z.object({
  page: z.coerce.number().int('must be a whole number').min(1, 'must be 1 or more').default(1),
  pageSize: z.coerce.number().int('must be a whole number').min(1, 'must be 1 or more').max(500, 'must be at most 500').default(50),
  sort: z
    .string()
    .regex(/^-?[A-Za-z][A-Za-z0-9]*$/, 'must be a field name, optionally prefixed with -')
    .optional(),
  q: lineSchema(120).optional(),
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
