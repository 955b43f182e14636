import { signInSchema } from '../../../../shared/schemas/session';
import { Button } from '../../../components/button';
import { FormMessage, TextField } from '../../../components/form-field';
import { useForm } from '../../../lib/form';
import { useSignIn } from '../api/session';

export function SignInForm({ onSignedIn }: { onSignedIn: () => void }) {
  const form = useForm({ email: '', password: '' });
  const signIn = useSignIn();

  return (
    <form
      data-testid="sign-in-form"
      noValidate
      className="space-y-4"
      onSubmit={(event) => {
        event.preventDefault();
        const input = form.check(signInSchema, form.values);
        if (!input) return;
        signIn.mutate(input, { onSuccess: onSignedIn, onError: form.showServerError });
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
