import { Navigate, useNavigate, useSearchParams } from 'react-router-dom';
import { ParapetMark } from '../components/layout/app-shell';
import { Loading } from '../components/query-state';
import { useSession } from '../features/auth/api/session';
import { SignInForm } from '../features/auth/components/sign-in-form';
import { safeNextPath } from '../lib/paths';

export function SignInPage() {
  const session = useSession();
  const navigate = useNavigate();
  const [searchParams] = useSearchParams();
  const next = safeNextPath(searchParams.get('next'));

  if (session.isPending) return <Loading label="Checking your session…" />;
  if (session.data?.user) return <Navigate to={next} replace />;

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
          <SignInForm onSignedIn={() => navigate(next, { replace: true })} />
        </div>
        <p className="mt-4 text-center text-xs text-muted">No account? Ask one of your network's admins.</p>
      </div>
    </main>
  );
}
