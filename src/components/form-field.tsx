import { useId, type ComponentPropsWithRef, type ReactNode } from 'react';
import { Button } from './button';

const CONTROL =
  'block w-full rounded-md border bg-surface px-2.5 py-1.5 text-sm text-ink placeholder:text-muted aria-[invalid=true]:border-danger border-line-strong';

interface Frame {
  label: string;
  errors?: string[];
  hint?: ReactNode;
}

// One frame for every field: the label, the control, a hint and the field's own errors.
function FieldFrame({ label, errors, hint, id, children }: Frame & { id: string; children: ReactNode }) {
  return (
    <div className="min-w-0">
      <label htmlFor={id} className="mb-1 block text-sm font-medium">
        {label}
      </label>
      {children}
      {hint && (
        <p id={`${id}-hint`} className="mt-1 text-xs text-muted">
          {hint}
        </p>
      )}
      <p id={`${id}-error`} aria-live="polite" className="mt-1 text-sm text-danger empty:hidden">
        {errors && errors.length > 0 ? errors.join(' ') : ''}
      </p>
    </div>
  );
}

function describedBy(id: string, hint: unknown, errors?: string[]) {
  return [hint ? `${id}-hint` : '', errors?.length ? `${id}-error` : ''].filter(Boolean).join(' ') || undefined;
}

export function TextField({ label, errors, hint, ...input }: Frame & ComponentPropsWithRef<'input'>) {
  const id = useId();
  return (
    <FieldFrame id={id} label={label} errors={errors} hint={hint}>
      <input id={id} className={CONTROL} aria-invalid={errors?.length ? true : undefined} aria-describedby={describedBy(id, hint, errors)} {...input} />
    </FieldFrame>
  );
}

export function TextAreaField({ label, errors, hint, ...input }: Frame & ComponentPropsWithRef<'textarea'>) {
  const id = useId();
  return (
    <FieldFrame id={id} label={label} errors={errors} hint={hint}>
      <textarea
        id={id}
        rows={3}
        className={CONTROL}
        aria-invalid={errors?.length ? true : undefined}
        aria-describedby={describedBy(id, hint, errors)}
        {...input}
      />
    </FieldFrame>
  );
}

export interface Option {
  value: string;
  label: string;
}

type SelectProps = Frame & ComponentPropsWithRef<'select'> & { options: Option[]; placeholder?: string };

export function SelectField({ label, errors, hint, options, placeholder, ...select }: SelectProps) {
  const id = useId();
  return (
    <FieldFrame id={id} label={label} errors={errors} hint={hint}>
      <select id={id} className={CONTROL} aria-invalid={errors?.length ? true : undefined} aria-describedby={describedBy(id, hint, errors)} {...select}>
        {placeholder !== undefined && <option value="">{placeholder}</option>}
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
    </FieldFrame>
  );
}

export function CheckboxField({ label, errors, hint, ...input }: Frame & Omit<ComponentPropsWithRef<'input'>, 'type'>) {
  const id = useId();
  return (
    <div>
      <div className="flex items-center gap-2">
        <input id={id} type="checkbox" className="h-4 w-4 accent-accent" aria-describedby={describedBy(id, hint, errors)} {...input} />
        <label htmlFor={id} className="text-sm font-medium">
          {label}
        </label>
      </div>
      {hint && (
        <p id={`${id}-hint`} className="mt-1 text-xs text-muted">
          {hint}
        </p>
      )}
      <p id={`${id}-error`} aria-live="polite" className="mt-1 text-sm text-danger empty:hidden">
        {errors?.join(' ') ?? ''}
      </p>
    </div>
  );
}

/** The form-wide message: what the schema or the server said that belongs to no single field. */
export function FormMessage({ message }: { message: string | null }) {
  return (
    <div aria-live="assertive" className="empty:hidden">
      {message && <p className="rounded-md border border-danger/40 bg-danger-soft px-3 py-2 text-sm text-ink">{message}</p>}
    </div>
  );
}

interface FormActionsProps {
  /** The submit button's words, e.g. "Add node". */
  label: string;
  /** While the form is being sent: the submit button is disabled and says `busyLabel`. */
  busy?: boolean;
  busyLabel?: string;
  /** Without it the row has no Cancel button. */
  onCancel?: () => void;
  cancelLabel?: string;
  /** Words beside the buttons that a screen reader hears when they change ("Saved."); blank renders nothing visible. */
  status?: string;
  className?: string;
}

/** The row under every form: submit (disabled while sending) and, where the form can be closed, Cancel. */
export function FormActions({ label, busy = false, busyLabel = 'Saving…', onCancel, cancelLabel = 'Cancel', status, className = '' }: FormActionsProps) {
  return (
    <div className={`flex flex-wrap items-center gap-2 ${className}`}>
      <Button type="submit" variant="primary" disabled={busy}>
        {busy ? busyLabel : label}
      </Button>
      {onCancel && <Button onClick={onCancel}>{cancelLabel}</Button>}
      {status !== undefined && (
        <span role="status" className="ml-1 text-sm text-muted">
          {status}
        </span>
      )}
    </div>
  );
}
