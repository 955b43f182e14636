import type { ReactNode } from 'react';
import { ParapetMark } from './layout/parapet-mark';

/** The narrow, centred card of the signed-out pages: sign-in, password reset, invitation. */
export function NarrowCard({ title, subtitle, children, footer }: { title: string; subtitle?: ReactNode; children: ReactNode; footer?: ReactNode }) {
  return (
    <main className="flex min-h-screen items-start justify-center px-4 pt-[10vh]">
      <div className="w-full max-w-sm">
        <div className="mb-6 flex items-center gap-2.5">
          <ParapetMark size={36} />
          <span className="text-2xl font-semibold tracking-tight">Parapet</span>
        </div>
        <div className="rounded-lg border border-line bg-surface p-5 shadow-sm">
          <h1 className={subtitle ? 'mb-1 text-lg font-semibold' : 'mb-3 text-lg font-semibold'}>{title}</h1>
          {subtitle && <p className="mb-4 text-sm text-muted">{subtitle}</p>}
          {children}
        </div>
        {footer}
      </div>
    </main>
  );
}
