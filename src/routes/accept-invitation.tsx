import { Link, useParams } from 'react-router-dom';
import { useAcceptInvitation } from '../features/people/api/account';
import { AccountCard } from '../features/people/components/account-card';
import { NewPasswordForm } from '../features/people/components/new-password-form';
import { paths } from '../lib/paths';

export function AcceptInvitationPage() {
  const token = useParams().token ?? '';
  const accept = useAcceptInvitation();
  return (
    <AccountCard title="Welcome to Parapet">
      {accept.isSuccess ? (
        <p role="status" data-testid="invitation-accepted" className="text-sm">
          {accept.data}{' '}
          <Link to={paths.signIn.to()} className="text-accent hover:underline">
            Sign in
          </Link>
        </p>
      ) : (
        <>
          <p className="mb-4 text-sm text-muted">You were invited to the community network’s console. Choose a password to finish setting up your account.</p>
          <NewPasswordForm
            submitLabel="Set my password"
            pending={accept.isPending}
            onSubmit={(password, showError) => accept.mutate({ token, password }, { onError: showError })}
          />
        </>
      )}
    </AccountCard>
  );
}
