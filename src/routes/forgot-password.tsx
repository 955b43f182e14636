import { z } from 'zod';
import { Button } from '../components/button';
import { FormMessage, TextField } from '../components/form-field';
import { useRequestPasswordReset } from '../features/people/api/account';
import { AccountCard } from '../features/people/components/account-card';
import { lazySchema, useSchemaForm } from '../lib/schema-form';

// Its module also holds the password rules and their dictionary: fetched when the form is first used.
const loadSchema = lazySchema(() => import('../../shared/schemas/account').then((m) => m.passwordResetRequestSchema as z.ZodType<{ email: string }>));

export function ForgotPasswordPage() {
  const form = useSchemaForm({ defaultValues: { email: '' }, schema: loadSchema });
  const request = useRequestPasswordReset();
  const submit = form.handleSubmit((input) => request.mutate(input.email, { onError: form.showServerError }));
  return (
    <AccountCard title="Forgot your password?">
      {request.isSuccess ? (
        <p role="status" data-testid="reset-requested" className="text-sm">
          {request.data}
        </p>
      ) : (
        <form noValidate className="space-y-4" onFocus={() => void loadSchema().catch(() => undefined)} onSubmit={submit}>
          <p className="text-sm text-muted">Give the e-mail address you sign in with. If it has an account, we mail it a link to choose a new password.</p>
          <FormMessage message={form.formError} />
          <TextField label="E-mail" type="email" autoComplete="username" {...form.field('email')} />
          <Button type="submit" variant="primary" className="w-full py-2" disabled={request.isPending}>
            {request.isPending ? 'Sending…' : 'Mail me a link'}
          </Button>
        </form>
      )}
    </AccountCard>
  );
}
