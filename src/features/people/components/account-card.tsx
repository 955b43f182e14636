import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { ParapetMark } from '../../../components/layout/app-shell';
import { paths } from '../../../lib/paths';

/** The narrow card the signed-out account pages share with the sign-in page. */
export function AccountCard({ title, children }: { title: string; children: ReactNode }) {
  return (
    <main className="flex min-h-screen items-start justify-center px-4 pt-[10vh]">
      <div className="w-full max-w-sm">
        <div className="mb-6 flex items-center gap-2.5">
          <ParapetMark size={36} />
          <span className="text-2xl font-semibold tracking-tight">Parapet</span>
        </div>
        <div className="rounded-lg border border-line bg-surface p-5 shadow-sm">
          <h1 className="mb-3 text-lg font-semibold">{title}</h1>
          {children}
        </div>
        <p className="mt-4 text-center text-sm">
          <Link to={paths.signIn.to()} className="text-accent hover:underline">
            Back to sign in
          </Link>
        </p>
      </div>
    </main>
  );
}
