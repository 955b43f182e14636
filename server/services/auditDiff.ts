// What an audit entry keeps: the changed fields only, secrets masked, bookkeeping left out.

/** Fields whose values never enter the history; that they changed is still recorded. */
export const MASKED_FIELDS = new Set(['passwordHash', 'preSharedKey', 'tokenHash']);
export const HIDDEN = '(hidden)';
const ALWAYS_IGNORED = new Set(['createdAt', 'updatedAt']);

type Row = Record<string, unknown>;

const comparable = (v: unknown) => (v instanceof Date ? v.toISOString() : v === undefined ? null : JSON.stringify(v));
const shown = (field: string, v: unknown) =>
  v === null || v === undefined ? null : MASKED_FIELDS.has(field) ? HIDDEN : v instanceof Date ? v.toISOString() : v;

/**
 * The before/after pair of the fields that differ (a create has no before, a delete no after).
 * Null when nothing worth recording changed.
 */
export function auditDiff(before: Row | null, after: Row | null, ignore: readonly string[] = []): { before: Row | null; after: Row | null } | null {
  const skip = new Set([...ALWAYS_IGNORED, ...ignore]);
  const fields = [...new Set([...Object.keys(before ?? {}), ...Object.keys(after ?? {})])].filter((f) => !skip.has(f));
  const changed = before && after ? fields.filter((f) => comparable(before[f]) !== comparable(after[f])) : fields;
  if (changed.length === 0) return null;
  const pick = (row: Row | null) => (row ? Object.fromEntries(changed.map((f) => [f, shown(f, row[f])])) : null);
  return { before: pick(before), after: pick(after) };
}
