import type { ReactNode } from 'react';

/** A record's fields as label/value pairs; two columns where there is room. */
export function Details({ items }: { items: { label: string; value: ReactNode }[] }) {
  return (
    <dl className="grid gap-x-6 gap-y-3 rounded-lg border border-line bg-surface p-4 sm:grid-cols-2 lg:grid-cols-3">
      {items.map((item) => (
        <div key={item.label} className="min-w-0">
          <dt className="text-xs font-medium tracking-wide text-muted uppercase">{item.label}</dt>
          <dd className="mt-0.5 text-sm break-words">{item.value ?? '—'}</dd>
        </div>
      ))}
    </dl>
  );
}
