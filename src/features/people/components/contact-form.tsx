import { useEffect, useState } from 'react';
import type { MeDto } from '../../../../shared/schemas/account';
import { FormMessage, TextField, FormActions } from '../../../components/form-field';
import { lazySchema, useForm } from '../../../lib/form';

// Its module also holds the password rules and their dictionary: fetched when the form is first used.
const loadSchema = lazySchema(() => import('../../../../shared/schemas/account').then((m) => m.meUpdateSchema));
import { useUpdateMe } from '../api/account';

export function ContactForm({ me }: { me: MeDto }) {
  const form = useForm({ name: me.name, phone: me.phone ?? '' });
  const update = useUpdateMe();
  const [saved, setSaved] = useState(false);
  useEffect(() => setSaved(false), [form.values]);
  return (
    <form
      noValidate
      data-testid="contact-form"
      className="max-w-md space-y-4"
      onFocus={() => void loadSchema().catch(() => undefined)}
      onSubmit={(event) => {
        event.preventDefault();
        void form.checkWith(loadSchema, { name: form.values.name, phone: form.values.phone.trim() === '' ? null : form.values.phone }).then((input) => {
          if (input) update.mutate(input, { onSuccess: () => setSaved(true), onError: form.showServerError });
        });
      }}
    >
      <FormMessage message={form.formError} />
      <p className="text-sm text-muted">E-mail: {me.email} (an admin can change it)</p>
      <TextField label="Name" name="name" autoComplete="name" value={form.values.name} onChange={(e) => form.set('name', e.target.value)} errors={form.errors.name} />
      <TextField label="Phone" name="phone" type="tel" autoComplete="tel" value={form.values.phone} onChange={(e) => form.set('phone', e.target.value)} errors={form.errors.phone} hint="The operators of your neighbourhood see it, so they can reach you when your node needs a hand." />
      <FormActions label="Save contact details" busy={update.isPending} status={saved ? 'Saved.' : ''} />
    </form>
  );
}
