import { useState } from 'react';
import { z } from 'zod';
import { Button } from '../../../components/button';
import { FormMessage, TextField } from '../../../components/form-field';
import { lazySchema, useSchemaForm } from '../../../lib/schema-form';

// The password rules carry a 460 KB dictionary: fetched when the form is first used, not with the page.
const loadSchema = lazySchema(() =>
  import('../../../../shared/security/passwordRules').then(({ newPasswordSchema }) =>
    z
      .object({ password: newPasswordSchema, repeat: z.string() })
      .refine((v) => v.password === v.repeat, { path: ['repeat'], message: 'does not match the password above' }),
  ),
);

export const PASSWORD_HINT = 'At least 12 characters. A few unrelated words work well; common passwords and your own name are refused.';

/** Choose a password once (invitation or reset): checked here with the server's own rules, then sent with the link's token. */
export function NewPasswordForm({
  submitLabel,
  pending,
  onSubmit,
}: {
  submitLabel: string;
  pending: boolean;
  onSubmit: (password: string, showError: (e: unknown) => void) => void;
}) {
  const form = useSchemaForm({ defaultValues: { password: '', repeat: '' }, schema: loadSchema });
  const [shown, setShown] = useState(false);
  const submit = form.handleSubmit((input) => onSubmit(input.password, form.showServerError));
  return (
    <form noValidate data-testid="new-password-form" className="space-y-4" onFocus={() => void loadSchema().catch(() => undefined)} onSubmit={submit}>
      <FormMessage message={form.formError} />
      <TextField label="New password" type={shown ? 'text' : 'password'} autoComplete="new-password" {...form.field('password')} hint={PASSWORD_HINT} />
      <TextField label="The same password again" type={shown ? 'text' : 'password'} autoComplete="new-password" {...form.field('repeat')} />
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" checked={shown} onChange={(e) => setShown(e.target.checked)} /> Show the password
      </label>
      <Button type="submit" variant="primary" className="w-full py-2" disabled={pending}>
        {pending ? 'Saving…' : submitLabel}
      </Button>
    </form>
  );
}
