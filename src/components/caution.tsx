import type { ReactNode } from 'react';

/** A short safety note where the work can hurt someone; it defers to local rules, never replaces them. */
export function Caution({ title = 'Caution', children }: { title?: string; children: ReactNode }) {
  return (
    <aside role="note" aria-label={title} className="flex gap-2.5 rounded-md border border-caution/40 bg-caution-soft px-3 py-2 text-sm text-ink">
      <svg width="18" height="18" viewBox="0 0 16 16" aria-hidden="true" className="mt-0.5 shrink-0">
        <path d="M8 1.5 15 14.5H1z" fill="none" stroke="currentColor" strokeWidth="1.4" strokeLinejoin="round" className="text-caution" />
        <path d="M8 6v4M8 11.6v.4" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" className="text-caution" />
      </svg>
      <p>
        <strong className="font-semibold">{title}: </strong>
        {children}
      </p>
    </aside>
  );
}
