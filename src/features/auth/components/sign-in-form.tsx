import { Button } from '../../../components/button';
import { FormMessage, TextField } from '../../../components/form-field';
import { lazySchema, useForm } from '../../../lib/form';
import { useSignIn } from '../api/session';

// The shared schema (and the validation library under it) is fetched once someone starts typing,
// not with the page: the sign-in page is often opened on a phone on weak mobile data.
const loadSchema = lazySchema(() => import('../../../../shared/schemas/session').then((m) => m.signInSchema));

export function SignInForm({ onSignedIn }: { onSignedIn: () => void }) {
  const form = useForm({ email: '', password: '' });
  const signIn = useSignIn();

  return (
    <form
      data-testid="sign-in-form"
      noValidate
      className="space-y-4"
      onFocus={() => void loadSchema().catch(() => undefined)}
      onSubmit={(event) => {
        event.preventDefault();
        void form.checkWith(loadSchema, form.values).then((input) => {
          if (input) signIn.mutate(input, { onSuccess: onSignedIn, onError: form.showServerError });
        });
      }}
    >
      <FormMessage message={form.formError} />
      <TextField
        label="E-mail"
        name="email"
        type="email"
        autoComplete="username"
        value={form.values.email}
        onChange={(event) => form.set('email', event.target.value)}
        errors={form.errors.email}
      />
      <TextField
        label="Password"
        name="password"
        type="password"
        autoComplete="current-password"
        value={form.values.password}
        onChange={(event) => form.set('password', event.target.value)}
        errors={form.errors.password}
      />
      <Button type="submit" variant="primary" className="w-full py-2" disabled={signIn.isPending}>
        {signIn.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
