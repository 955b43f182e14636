import { Link, Navigate, useSearchParams } from 'react-router-dom';
import type { SessionUser } from '../../shared/schemas/session';
import { ParapetMark } from '../components/layout/app-shell';
import { Loading } from '../components/query-state';
import { useSession } from '../features/auth/api/session';
import { SignInForm } from '../features/auth/components/sign-in-form';
import { paths, safeNextPath } from '../lib/paths';

/** Where a person lands: the page they were sent from, else hosts their own nodes and everyone else the overview. */
function landingFor(user: SessionUser, next: string | null): string {
  const safe = safeNextPath(next);
  if (safe !== paths.overview.to()) return safe;
  return user.role === 'host' ? paths.myNodes.to() : safe;
}

export function SignInPage() {
  const session = useSession();
  const [searchParams] = useSearchParams();

  if (session.isPending) return <Loading label="Checking your session…" />;
  // Signing in refreshes the session, which lands here and moves on.
  if (session.data?.user) return <Navigate to={landingFor(session.data.user, searchParams.get('next'))} replace />;

  return (
    <main className="flex min-h-screen items-start justify-center px-4 pt-[12vh]">
      <div className="w-full max-w-sm">
        <div className="mb-6 flex items-center gap-2.5">
          <ParapetMark size={36} />
          <span className="text-2xl font-semibold tracking-tight">Parapet</span>
        </div>
        <div className="rounded-lg border border-line bg-surface p-5 shadow-sm">
          <h1 className="mb-1 text-lg font-semibold">Sign in</h1>
          <p className="mb-4 text-sm text-muted">The console for the people who keep the network on the roofs running.</p>
          <SignInForm onSignedIn={() => undefined} />
          <p className="mt-3 text-center text-sm">
            <Link to={paths.forgotPassword.to()} className="text-accent hover:underline">
              Forgot password?
            </Link>
          </p>
        </div>
        <p className="mt-4 text-center text-xs text-muted">No account? Ask one of your network's admins.</p>
      </div>
    </main>
  );
}
