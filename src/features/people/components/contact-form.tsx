import { useEffect, useState } from 'react';
import type { MeDto } from '../../../../shared/schemas/account';
import { FormMessage, TextField, FormActions } from '../../../components/form-field';
import { lazySchema, useSchemaForm } from '../../../lib/schema-form';
import { useUpdateMe } from '../api/account';

// Its module also holds the password rules and their dictionary: fetched when the form is first used.
const loadSchema = lazySchema(() => import('../../../../shared/schemas/account').then((m) => m.meUpdateSchema));

export function ContactForm({ me }: { me: MeDto }) {
  const form = useSchemaForm({
    defaultValues: { name: me.name, phone: me.phone ?? '' },
    schema: loadSchema,
    toInput: (values) => ({ name: values.name, phone: values.phone.trim() === '' ? null : values.phone }),
  });
  const update = useUpdateMe();
  const [saved, setSaved] = useState(false);
  // "Saved." goes as soon as anything is typed again.
  const { watch } = form;
  useEffect(() => {
    const watching = watch(() => setSaved(false));
    return () => watching.unsubscribe();
  }, [watch]);
  const submit = form.handleSubmit((input) => update.mutate(input, { onSuccess: () => setSaved(true), onError: form.showServerError }));
  return (
    <form noValidate data-testid="contact-form" className="max-w-md space-y-4" onFocus={() => void loadSchema().catch(() => undefined)} onSubmit={submit}>
      <FormMessage message={form.formError} />
      <p className="text-sm text-muted">E-mail: {me.email} (an admin can change it)</p>
      <TextField label="Name" autoComplete="name" {...form.field('name')} />
      <TextField
        label="Phone"
        type="tel"
        autoComplete="tel"
        {...form.field('phone')}
        hint="The operators of your neighbourhood see it, so they can reach you when your node needs a hand."
      />
      <FormActions label="Save contact details" busy={update.isPending} status={saved ? 'Saved.' : ''} />
    </form>
  );
}
