import { useCallback, useState } from 'react';
import type { z } from 'zod';
import { ApiError } from './api';

export type FieldErrors = Record<string, string[]>;

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

/** Text from an input as a number: blank is "not given", a decimal comma is accepted. */
export function toNumber(text: string): number | undefined {
  const trimmed = text.trim();
  if (trimmed === '') return undefined;
  return Number(trimmed.replace(',', '.'));
}

/** An id from a select: blank means "none" where the schema allows null. */
export function toIdOrNull(text: string): number | null {
  return text === '' ? null : Number(text);
}

export function optionalText(text: string): string | undefined {
  return text.trim() === '' ? undefined : text;
}

function group(entries: { path: string; message: string }[]): FieldErrors {
  const result: FieldErrors = {};
  for (const { path, message } of entries) (result[path] ??= []).push(message);
  return result;
}

/**
 * Form state for a form whose inputs are text: validate with a shared zod schema before sending,
 * and place both the schema's issues and the server's 400 details next to the fields by path.
 */
export function useForm<V extends Record<string, string | boolean>>(initial: V) {
  const [values, setValues] = useState<V>(initial);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [formError, setFormError] = useState<string | null>(null);

  const set = useCallback(<K extends keyof V>(name: K, value: V[K]) => {
    setValues((current) => ({ ...current, [name]: value }));
  }, []);

  const place = useCallback(
    (entries: { path: string; message: string }[], summary: string) => {
      const fieldNames = new Set(Object.keys(initial));
      const placed = entries.filter((e) => fieldNames.has(e.path));
      const unplaced = entries.filter((e) => !fieldNames.has(e.path));
      setErrors(group(placed));
      const extra = unplaced.map((e) => (e.path ? `${e.path}: ${e.message}` : e.message));
      setFormError([summary, ...extra].join(' '));
    },
    [initial],
  );

  function check<S extends z.ZodType>(schema: S, input: unknown): z.output<S> | null {
    const result = schema.safeParse(input);
    if (result.success) {
      setErrors({});
      setFormError(null);
      return result.data;
    }
    const given = (input ?? {}) as Record<string, unknown>;
    place(
      result.error.issues.map((issue) => ({
        path: issue.path.map(String).join('.'),
        // A blank field is "required", not "must be a number": the person left it out, they did not mistype it.
        message: issue.code === 'invalid_type' && issue.path.length === 1 && given[String(issue.path[0])] === undefined ? 'is required' : issue.message,
      })),
      'Some fields need attention.',
    );
    return null;
  }

  /** `check` with a schema that may still be on its way (see `lazySchema`). */
  async function checkWith<S extends z.ZodType>(load: () => Promise<S>, input: unknown): Promise<z.output<S> | null> {
    let schema: S;
    try {
      schema = await load();
    } catch {
      setFormError('This form could not load its checks. Check your connection and try again.');
      return null;
    }
    return check(schema, input);
  }

  const showServerError = useCallback(
    (error: unknown) => {
      if (error instanceof ApiError) {
        if (error.details.length > 0) place(error.details, error.message);
        else {
          setErrors({});
          setFormError(error.message);
        }
      } else {
        setFormError('Something went wrong. Try again.');
      }
    },
    [place],
  );

  const reset = useCallback((next: V) => {
    setValues(next);
    setErrors({});
    setFormError(null);
  }, []);

  return { values, set, errors, formError, check, checkWith, showServerError, reset };
}

export type FormApi<V extends Record<string, string | boolean>> = ReturnType<typeof useForm<V>>;
