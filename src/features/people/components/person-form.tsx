import { ROLES } from '../../../../shared/enums';
import type { UserDto } from '../../../../shared/schemas/user';
import { FormMessage, SelectField, TextField, FormActions } from '../../../components/form-field';
import { capitalise } from '../../../lib/format';
import { lazySchema, useForm } from '../../../lib/form';

// The password rules carry a 460 KB dictionary: fetched when the form is first used, not with the page.
const loadSchema = lazySchema(() => import('../../../../shared/schemas/user').then((m) => m.userCreateSchema));
import { useCreatePerson } from '../api/people';

const ROLE_HINT = 'Admins coordinate the whole network; operators look after their neighbourhoods; hosts see the sites they host.';

export function PersonForm({ onSaved, onCancel }: { onSaved: (person: UserDto) => void; onCancel: () => void }) {
  const form = useForm({ name: '', email: '', role: 'host', password: '', phone: '' });
  const create = useCreatePerson();
  const { values, errors, set } = form;

  function submit() {
    const input = { ...values, phone: values.phone.trim() === '' ? null : values.phone };
    void form.checkWith(loadSchema, input).then((parsed) => {
      if (parsed) create.mutate(parsed, { onSuccess: onSaved, onError: form.showServerError });
    });
  }

  return (
    <form
      noValidate
      aria-label="New person"
      className="space-y-4 rounded-lg border border-line bg-surface p-4"
      onFocus={() => void loadSchema().catch(() => undefined)}
      onSubmit={(event) => {
        event.preventDefault();
        submit();
      }}
    >
      <FormMessage message={form.formError} />
      <div className="grid gap-4 sm:grid-cols-2">
        <TextField label="Name" autoComplete="off" value={values.name} onChange={(e) => set('name', e.target.value)} errors={errors.name} />
        <TextField label="E-mail" type="email" autoComplete="off" value={values.email} onChange={(e) => set('email', e.target.value)} errors={errors.email} />
        <SelectField label="Role" value={values.role} onChange={(e) => set('role', e.target.value)} options={ROLES.map((role) => ({ value: role, label: capitalise(role) }))} errors={errors.role} hint={ROLE_HINT} />
        <TextField label="Phone" type="tel" autoComplete="off" value={values.phone} onChange={(e) => set('phone', e.target.value)} errors={errors.phone} hint="Optional; used when a node they host goes down." />
        <TextField label="Starting password" type="password" autoComplete="new-password" value={values.password} onChange={(e) => set('password', e.target.value)} errors={errors.password} hint="At least 12 characters. Hand it over in person, not by e-mail." />
      </div>
      <FormActions label="Add person" busy={create.isPending} busyLabel="Adding…" onCancel={onCancel} />
    </form>
  );
}
