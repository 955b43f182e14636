import type { Actor } from './actor';

/**
 * A SQL boolean expression for raw queries, with the caller's ids written in as integer array
 * literals: it needs no bind parameters, so it drops into any query whatever its own binds are.
 * Only integers from the actor (loaded from the database) ever reach the text.
 */
export type ScopeSql = string;

/** `'{1,2,3}'::int[]`, refusing anything but safe integers so no text can reach the SQL. */
export function intArray(ids: readonly number[]): string {
  for (const id of ids) if (!Number.isSafeInteger(id)) throw new Error(`scope id ${String(id)} is not an integer`);
  return `'{${ids.join(',')}}'::int[]`;
}

/** A column name with an optional table alias, checked so it can only be an identifier. */
export function column(alias: string, name: string): string {
  const ref = alias ? `${alias}.${name}` : name;
  if (!/^[a-z_][a-z0-9_]*(\.[a-z_][a-z0-9_]*)?$/i.test(ref)) throw new Error(`"${ref}" is not a column reference`);
  return ref;
}

/** Operators of a neighbourhood, by role: everyone else operates none, whatever rows remain. */
export const operatedIds = (a: Actor): number[] => (a.role === 'operator' ? a.neighbourhoodIds : []);

/** The neighbourhoods an actor manages as SQL on a neighbourhood-id column (admins: every one). */
export function managedSql(a: Actor, hoodColumn: string): ScopeSql {
  if (a.role === 'admin') return 'true';
  const ids = operatedIds(a);
  return ids.length ? `${column('', hoodColumn)} = ANY(${intArray(ids)})` : 'false';
}
