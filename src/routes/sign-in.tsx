import { Link, Navigate, useSearchParams } from 'react-router-dom';
import type { SessionUser } from '../../shared/schemas/session';
import { NarrowCard } from '../components/narrow-card';
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
    <NarrowCard
      title="Sign in"
      subtitle="The console for the people who keep the network on the roofs running."
      footer={<p className="mt-4 text-center text-xs text-muted">No account? Ask one of your network's admins.</p>}
    >
      <SignInForm onSignedIn={() => undefined} />
      <p className="mt-3 text-center text-sm">
        <Link to={paths.forgotPassword.to()} className="text-accent hover:underline">
          Forgot password?
        </Link>
      </p>
    </NarrowCard>
  );
}
