import { useState } from 'react';
import { z } from 'zod';
import { FormMessage, TextField, FormActions } from '../../../components/form-field';
import { lazySchema, useForm } from '../../../lib/form';
import { useChangePassword } from '../api/account';
import { PASSWORD_HINT } from './new-password-form';

// The password rules carry a 460 KB dictionary: fetched when the form is first used, not with the page.
const loadSchema = lazySchema(() =>
  import('../../../../shared/schemas/account').then(({ passwordChangeSchema }) =>
    passwordChangeSchema.extend({ repeat: z.string() }).refine((v) => v.newPassword === v.repeat, { path: ['repeat'], message: 'does not match the new password' }),
  ),
);
const EMPTY = { currentPassword: '', newPassword: '', repeat: '' };

export function ChangePasswordForm() {
  const form = useForm(EMPTY);
  const change = useChangePassword();
  const [done, setDone] = useState(false);
  return (
    <form
      noValidate
      data-testid="change-password-form"
      className="max-w-md space-y-4"
      onFocus={() => void loadSchema().catch(() => undefined)}
      onSubmit={(event) => {
        event.preventDefault();
        setDone(false);
        void form.checkWith(loadSchema, form.values).then((input) => {
          if (!input) return;
          change.mutate(
            { currentPassword: input.currentPassword, newPassword: input.newPassword },
            { onSuccess: () => { form.reset(EMPTY); setDone(true); }, onError: form.showServerError },
          );
        });
      }}
    >
      <FormMessage message={form.formError} />
      <TextField label="Current password" name="currentPassword" type="password" autoComplete="current-password" value={form.values.currentPassword} onChange={(e) => form.set('currentPassword', e.target.value)} errors={form.errors.currentPassword} />
      <TextField label="New password" name="newPassword" type="password" autoComplete="new-password" value={form.values.newPassword} onChange={(e) => form.set('newPassword', e.target.value)} errors={form.errors.newPassword} hint={PASSWORD_HINT} />
      <TextField label="The new password again" name="repeat" type="password" autoComplete="new-password" value={form.values.repeat} onChange={(e) => form.set('repeat', e.target.value)} errors={form.errors.repeat} />
      <FormActions label="Change password" busy={change.isPending} busyLabel="Changing…" status={done ? 'Changed. Your other devices are signed out.' : ''} />
    </form>
  );
}
