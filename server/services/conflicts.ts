import { UniqueConstraintError } from 'sequelize';
import { Conflict } from '../errors';

/**
 * Runs a write and turns the database's unique-index refusal into a 409 that names what clashed.
 * The index stays the source of truth (two people can race); this only words its answer.
 */
export async function uniquely<T>(work: () => Promise<T>, message: string): Promise<T> {
  try {
    return await work();
  } catch (err) {
    if (err instanceof UniqueConstraintError) throw Conflict(message, 'duplicate');
    throw err;
  }
}

/** "1 node", "3 sites": counts in a sentence. */
export const countOf = (n: number, singular: string, plural = `${singular}s`) => `${n} ${n === 1 ? singular : plural}`;

/** A record that others still depend on cannot go; say what holds it and what to do. */
export const InUse = (message: string) => Conflict(message, 'in_use');
