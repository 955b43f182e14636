import { useState, type FormEvent } from 'react';
import { Button } from '../../../components/button';
import { FormMessage, TextField } from '../../../components/form-field';
import { lazySchema, placeIssues, placeServerError, schemaIssues } from '../../../lib/schema-issues';
import { useSignIn } from '../api/session';

// The shared schema (and the validation library under it) is fetched once someone starts typing,
// not with the page: the sign-in page is often opened on a phone on weak mobile data.
const loadSchema = lazySchema(() => import('../../../../shared/schemas/session').then((m) => m.signInSchema));

const FIELDS = ['email', 'password'] as const;
type Field = (typeof FIELDS)[number];
type FieldErrors = Partial<Record<Field, string>>;

const LOAD_FAILED = 'This form could not load its checks. Check your connection and try again.';

/**
 * Two fields in plain React state rather than through the form library the console's other forms use (`useSchemaForm`):
 * this is the one form on a page people open before signing in, so it stays light. Same checks (the shared schema),
 * same words, and the same behaviour: errors under their fields, the form-wide message announced, the first invalid field focused.
 */
export function SignInForm({ onSignedIn }: { onSignedIn: () => void }) {
  const [values, setValues] = useState<Record<Field, string>>({ email: '', password: '' });
  const [errors, setErrors] = useState<FieldErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const signIn = useSignIn();

  async function submit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = event.currentTarget;
    const show = (fields: FieldErrors, message: string | null) => {
      setErrors(fields);
      setFormError(message);
      const first = FIELDS.find((name) => fields[name]);
      if (first) (form.elements.namedItem(first) as HTMLInputElement | null)?.focus();
    };
    // The server's answer to a failed send: 400 details under their fields (the first focused), anything else in the form message.
    const showServerError = (error: unknown) => {
      const placed = placeServerError(error, FIELDS);
      show(placed.fields, placed.formError);
    };
    if (signIn.isPending) return;
    let schema;
    try {
      schema = await loadSchema();
    } catch {
      return show({}, LOAD_FAILED);
    }
    const result = schema.safeParse(values);
    if (!result.success) {
      const placed = placeIssues(schemaIssues(result.error.issues, values), FIELDS, 'Some fields need attention.');
      return show(placed.fields, placed.formError);
    }
    show({}, null);
    signIn.mutate(result.data, { onSuccess: onSignedIn, onError: showServerError });
  }

  const field = (name: Field) => ({
    name,
    value: values[name],
    onChange: (event: { target: { value: string } }) => setValues((current) => ({ ...current, [name]: event.target.value })),
    errors: errors[name] ? [errors[name]] : undefined,
  });

  return (
    <form data-testid="sign-in-form" noValidate className="space-y-4" onFocus={() => void loadSchema().catch(() => undefined)} onSubmit={(e) => void submit(e)}>
      <FormMessage message={formError} />
      <TextField label="E-mail" type="email" autoComplete="username" {...field('email')} />
      <TextField label="Password" type="password" autoComplete="current-password" {...field('password')} />
      <Button type="submit" variant="primary" className="w-full py-2" disabled={signIn.isPending}>
        {signIn.isPending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  );
}
