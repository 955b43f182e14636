import type { ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router-dom';
import type { SessionUser } from '../../../../shared/schemas/session';
import { LoadError, Loading } from '../../../components/query-state';
import { paths } from '../../../lib/paths';
import { useSession, wasSignedOutOnPurpose } from '../api/session';

/** Signed-out visitors go to sign-in, carrying where they were so they come back to it. */
export function RequireSession({ children }: { children: (user: SessionUser) => ReactNode }) {
  const session = useSession();
  const location = useLocation();
  if (session.isPending) {
    return (
      <div className="p-6">
        <Loading label="Checking your session…" />
      </div>
    );
  }
  if (session.isError) {
    return (
      <div className="p-6">
        <LoadError error={session.error} />
      </div>
    );
  }
  const user = session.data.user;
  if (!user) return <Navigate to={paths.signIn.to(wasSignedOutOnPurpose() ? undefined : `${location.pathname}${location.search}`)} replace />;
  return <>{children(user)}</>;
}
