import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { NarrowCard } from '../../../components/narrow-card';
import { paths } from '../../../lib/paths';

/** The signed-out account pages: the sign-in card with a way back to sign in. */
export function AccountCard({ title, children }: { title: string; children: ReactNode }) {
  return (
    <NarrowCard
      title={title}
      footer={
        <p className="mt-4 text-center text-sm">
          <Link to={paths.signIn.to()} className="text-accent hover:underline">
            Back to sign in
          </Link>
        </p>
      }
    >
      {children}
    </NarrowCard>
  );
}
