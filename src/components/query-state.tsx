import type { ReactNode } from 'react';
import { errorMessage } from '../lib/api';

export function Loading({ label = 'Loading…' }: { label?: string }) {
  return (
    <p role="status" className="py-6 text-sm text-muted">
      {label}
    </p>
  );
}

/** A failed read, in the server's own words when it gave them. */
export function LoadError({ error, children }: { error: unknown; children?: ReactNode }) {
  const message = errorMessage(error, 'Something went wrong while loading. Try again.');
  return (
    <div role="alert" className="rounded-md border border-danger/40 bg-danger-soft px-3 py-2 text-sm text-ink">
      <p>{message}</p>
      {children}
    </div>
  );
}
