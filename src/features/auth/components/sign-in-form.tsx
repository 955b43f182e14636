import { Button } from '../../../components/button';
import { FormMessage, TextField } from '../../../components/form-field';
import { lazySchema, useSchemaForm } from '../../../lib/schema-form';
import { useSignIn } from '../api/session';

// The shared schema (and the validation library under it) is fetched once someone starts typing,
// not with the page: the sign-in page is often opened on a phone on weak mobile data.
const loadSchema = lazySchema(() => import('../../../../shared/schemas/session').then((m) => m.signInSchema));

export function SignInForm({ onSignedIn }: { onSignedIn: () => void }) {
  const form = useSchemaForm({ defaultValues: { email: '', password: '' }, schema: loadSchema });
  const signIn = useSignIn();
  const submit = form.handleSubmit((input) => signIn.mutate(input, { onSuccess: onSignedIn, onError: form.showServerError }));

  return (
    <form data-testid="sign-in-form" noValidate className="space-y-4" onFocus={() => void loadSchema().catch(() => undefined)} onSubmit={submit}>
      <FormMessage message={form.formError} />
      <TextField label="E-mail" type="email" autoComplete="username" {...form.field('email')} />
      <TextField label="Password" type="password" autoComplete="current-password" {...form.field('password')} />
      <Button type="submit" variant="primary" className="w-full py-2" disabled={signIn.isPending}>
        {signIn.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
