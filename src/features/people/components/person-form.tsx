import { ROLES } from '../../../../shared/enums';
import type { UserDto } from '../../../../shared/schemas/user';
import { FormMessage, SelectField, TextField, FormActions } from '../../../components/form-field';
import { capitalise } from '../../../lib/format';
import { lazySchema, useSchemaForm } from '../../../lib/schema-form';
import { useCreatePerson } from '../api/people';

// The password rules carry a 460 KB dictionary: fetched when the form is first used, not with the page.
const loadSchema = lazySchema(() => import('../../../../shared/schemas/user').then((m) => m.userCreateSchema));

const ROLE_HINT = 'Admins coordinate the whole network; operators look after their neighbourhoods; hosts see the sites they host.';

export function PersonForm({ onSaved, onCancel }: { onSaved: (person: UserDto) => void; onCancel: () => void }) {
  const create = useCreatePerson();
  const form = useSchemaForm({
    defaultValues: { name: '', email: '', role: 'host', password: '', phone: '' },
    schema: loadSchema,
    toInput: (values) => ({ ...values, phone: values.phone.trim() === '' ? null : values.phone }),
  });
  const { field } = form;
  const submit = form.handleSubmit((input) => create.mutate(input, { onSuccess: onSaved, onError: form.showServerError }));

  return (
    <form
      noValidate
      aria-label="New person"
      className="space-y-4 rounded-lg border border-line bg-surface p-4"
      onFocus={() => void loadSchema().catch(() => undefined)}
      onSubmit={submit}
    >
      <FormMessage message={form.formError} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Name" autoComplete="off" {...field('name')} />
        <TextField label="E-mail" type="email" autoComplete="off" {...field('email')} />
        <SelectField label="Role" {...field('role')} options={ROLES.map((role) => ({ value: role, label: capitalise(role) }))} hint={ROLE_HINT} />
        <TextField label="Phone" type="tel" autoComplete="off" {...field('phone')} hint="Optional; used when a node they host goes down." />
        <TextField
          label="Starting password"
          type="password"
          autoComplete="new-password"
          {...field('password')}
          hint="At least 12 characters. Hand it over in person, not by e-mail."
        />
      </div>
      <FormActions label="Add person" busy={create.isPending} busyLabel="Adding…" onCancel={onCancel} />
    </form>
  );
}
