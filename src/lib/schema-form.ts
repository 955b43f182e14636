import { useState } from 'react';
import { useForm, type DefaultValues, type FieldError, type FieldErrors, type FieldPath, type Resolver, type UseFormRegisterReturn } from 'react-hook-form';
import type { z } from 'zod';
import { lazySchema, placeIssues, placeServerError, schemaIssues, type Issue } from './schema-issues';

export { lazySchema, placeIssues, schemaIssues, type Issue };

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

type Values = Record<string, string | boolean>;
type SchemaSource<S> = S | (() => Promise<S>);

interface SchemaFormOptions<V extends Values, S extends z.ZodType> {
  defaultValues: V;
  /** The shared zod schema the API checks with, or a loader from `lazySchema`. */
  schema: SchemaSource<S>;
  /** What the API is sent, from the text in the fields (numbers converted, blanks left out); the values as they are by default. */
  toInput?: (values: V) => unknown;
}

/**
 * react-hook-form with a shared zod schema: the fields hold text; on submit `toInput` turns it into the API's input, the
 * schema checks it, and its issues (and the server's 400 details) are shown under the fields by path, focusing the first.
 */
export function useSchemaForm<V extends Values, S extends z.ZodType>({ defaultValues, schema, toInput = (v) => v }: SchemaFormOptions<V, S>) {
  const [formError, setFormError] = useState<string | null>(null);
  const fieldNames = Object.keys(defaultValues);

  const resolver: Resolver<V, unknown, z.output<S>> = async (values) => {
    let loaded: S;
    try {
      loaded = typeof schema === 'function' ? await (schema as () => Promise<S>)() : schema;
    } catch {
      const message = 'This form could not load its checks. Check your connection and try again.';
      setFormError(message);
      return { values: {}, errors: { root: { type: 'load', message } } as FieldErrors<V> };
    }
    const input = toInput(values);
    const result = loaded.safeParse(input);
    if (result.success) {
      setFormError(null);
      return { values: result.data, errors: {} };
    }
    const placed = placeIssues(schemaIssues(result.error.issues, input), fieldNames, 'Some fields need attention.');
    setFormError(placed.formError);
    // The form-wide message is an error too, so issues that belong to no field still stop the send.
    const errors: Record<string, FieldError> = { root: { type: 'schema', message: placed.formError } };
    for (const [path, message] of Object.entries(placed.fields)) errors[path] = { type: 'schema', message };
    return { values: {}, errors: errors as FieldErrors<V> };
  };

  const form = useForm<V, unknown, z.output<S>>({
    defaultValues: defaultValues as DefaultValues<V>,
    resolver,
    reValidateMode: 'onSubmit',
  });
  const { errors } = form.formState;

  /**
   * The props of a field: react-hook-form's registration, the field's own errors and, for text, its value, so a select
   * whose options arrive after the form still shows the chosen one. A checkbox stays with its registration.
   */
  function field<K extends FieldPath<V>>(name: K): UseFormRegisterReturn<K> & { errors?: string[]; value?: string } {
    const message = (errors[name] as FieldError | undefined)?.message;
    // eslint-disable-next-line react-hooks/incompatible-library -- watch() is meant to re-render on change; nothing here is memoised
    const value: unknown = form.watch(name);
    return { ...form.register(name), errors: message ? [message] : undefined, ...(typeof value === 'string' ? { value } : {}) };
  }

  /** The server's answer to a failed send: 400 details under their fields (the first focused), the rest in the form message. */
  function showServerError(error: unknown) {
    form.clearErrors();
    const placed = placeServerError(error, fieldNames);
    Object.entries(placed.fields).forEach(([path, message], index) =>
      form.setError(path as FieldPath<V>, { type: 'server', message }, { shouldFocus: index === 0 }),
    );
    setFormError(placed.formError);
  }

  function reset(next: V = defaultValues) {
    form.reset(next);
    setFormError(null);
  }

  return { ...form, field, formError, showServerError, reset };
}
