import { Link, useParams } from 'react-router-dom';
import { useCompletePasswordReset } from '../features/people/api/account';
import { AccountCard } from '../features/people/components/account-card';
import { NewPasswordForm } from '../features/people/components/new-password-form';
import { paths } from '../lib/paths';

export function ResetPasswordPage() {
  const token = useParams().token ?? '';
  const complete = useCompletePasswordReset();
  return (
    <AccountCard title="Choose a new password">
      {complete.isSuccess ? (
        <p role="status" className="text-sm">
          {complete.data}{' '}
          <Link to={paths.signIn.to()} className="text-accent hover:underline">
            Sign in
          </Link>
        </p>
      ) : (
        <NewPasswordForm
          submitLabel="Set the new password"
          pending={complete.isPending}
          onSubmit={(password, showError) => complete.mutate({ token, password }, { onError: showError })}
        />
      )}
    </AccountCard>
  );
}
