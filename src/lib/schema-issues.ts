import type { z } from 'zod';
import { ApiError } from './api';

// What a form needs from a shared zod schema without react-hook-form: the lazy loader and the issues placed
// under fields. schema-form.ts builds on these; the sign-in form uses them alone to stay light.

/**
 * A shared schema fetched on first use (when the form gets focus), so a page does not carry it, or
 * what it needs (the password dictionary, the validation library), before anyone starts typing.
 */
export function lazySchema<S extends z.ZodType>(load: () => Promise<S>): () => Promise<S> {
  let pending: Promise<S> | null = null;
  return () =>
    (pending ??= load().catch((error: unknown) => {
      pending = null; // a dropped connection may come back: try again next time
      throw error;
    }));
}

export interface Issue {
  path: string;
  message: string;
}

/** The schema's issues by path; a field left blank reads "is required", not "expected number": it was left out, not mistyped. */
export function schemaIssues(issues: readonly z.core.$ZodIssue[], given: unknown): Issue[] {
  const input = (given ?? {}) as Record<string, unknown>;
  return issues.map((issue) => ({
    path: issue.path.map(String).join('.'),
    message: issue.code === 'invalid_type' && issue.path.length === 1 && input[String(issue.path[0])] === undefined ? 'is required' : issue.message,
  }));
}

/**
 * Issues split into those that belong to a field of the form (messages of one field joined, as the field shows them) and
 * the rest, which the form-wide message carries after `summary`, each with its path.
 */
export function placeIssues(issues: Issue[], fieldNames: readonly string[], summary: string): { fields: Record<string, string>; formError: string } {
  const fields: Record<string, string> = {};
  const extra: string[] = [];
  for (const { path, message } of issues) {
    if (fieldNames.includes(path)) fields[path] = fields[path] ? `${fields[path]} ${message}` : message;
    else extra.push(path ? `${path}: ${message}` : message);
  }
  return { fields, formError: [summary, ...extra].join(' ') };
}

/**
 * The server's answer to a failed send, placed like the schema's issues: 400 details under their fields (the rest in
 * the form-wide message after the server's own), any other error in the form-wide message alone.
 */
export function placeServerError(error: unknown, fieldNames: readonly string[]): { fields: Record<string, string>; formError: string } {
  if (!(error instanceof ApiError)) return { fields: {}, formError: 'Something went wrong. Try again.' };
  if (error.details.length === 0) return { fields: {}, formError: error.message };
  return placeIssues(error.details, fieldNames, error.message);
}
