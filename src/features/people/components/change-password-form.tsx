import { useState } from 'react';
import { z } from 'zod';
import { FormMessage, TextField, FormActions } from '../../../components/form-field';
import { lazySchema, useSchemaForm } from '../../../lib/schema-form';
import { useChangePassword } from '../api/account';
import { PASSWORD_HINT } from './new-password-form';

// The password rules carry a 460 KB dictionary: fetched when the form is first used, not with the page.
const loadSchema = lazySchema(() =>
  import('../../../../shared/schemas/account').then(({ passwordChangeSchema }) =>
    passwordChangeSchema
      .extend({ repeat: z.string() })
      .refine((v) => v.newPassword === v.repeat, { path: ['repeat'], message: 'does not match the new password' }),
  ),
);
const EMPTY = { currentPassword: '', newPassword: '', repeat: '' };

export function ChangePasswordForm() {
  const form = useSchemaForm({ defaultValues: EMPTY, schema: loadSchema });
  const change = useChangePassword();
  const [done, setDone] = useState(false);
  const send = form.handleSubmit(({ currentPassword, newPassword }) =>
    change.mutate(
      { currentPassword, newPassword },
      {
        onSuccess: () => {
          form.reset(EMPTY);
          setDone(true);
        },
        onError: form.showServerError,
      },
    ),
  );
  return (
    <form
      noValidate
      data-testid="change-password-form"
      className="max-w-md space-y-4"
      onFocus={() => void loadSchema().catch(() => undefined)}
      onSubmit={(event) => {
        setDone(false);
        void send(event);
      }}
    >
      <FormMessage message={form.formError} />
      <TextField label="Current password" type="password" autoComplete="current-password" {...form.field('currentPassword')} />
      <TextField label="New password" type="password" autoComplete="new-password" {...form.field('newPassword')} hint={PASSWORD_HINT} />
      <TextField label="The new password again" type="password" autoComplete="new-password" {...form.field('repeat')} />
      <FormActions label="Change password" busy={change.isPending} busyLabel="Changing…" status={done ? 'Changed. Your other devices are signed out.' : ''} />
    </form>
  );
}
