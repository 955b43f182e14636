import { Forbidden } from '../errors';

/** Throws 403 unless the predicate allows the act; the record was already found readable. */
export function authorize(allowed: boolean, message?: string): void {
  if (!allowed) throw Forbidden(message);
}
