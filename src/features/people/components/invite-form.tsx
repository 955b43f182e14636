import { ROLES } from '../../../../shared/enums';
import type { UserDto } from '../../../../shared/schemas/user';
import { FormMessage, SelectField, TextField, FormActions } from '../../../components/form-field';
import { capitalise } from '../../../lib/format';
import { lazySchema, useForm } from '../../../lib/form';

// Its module also holds the password rules and their dictionary: fetched when the form is first used.
const loadSchema = lazySchema(() => import('../../../../shared/schemas/account').then((m) => m.invitationCreateSchema));
import { useInvite } from '../api/account';

/** An admin invites someone by e-mail; they choose their own password from the link. */
export function InviteForm({ onSent, onCancel }: { onSent: (person: UserDto & { invitationExpiresAt: string }) => void; onCancel: () => void }) {
  const form = useForm({ email: '', name: '', role: 'host' });
  const invite = useInvite();
  return (
    <form
      noValidate
      data-testid="invite-form"
      className="grid max-w-2xl gap-4 sm:grid-cols-3"
      onFocus={() => void loadSchema().catch(() => undefined)}
      onSubmit={(event) => {
        event.preventDefault();
        void form.checkWith(loadSchema, form.values).then((input) => {
          if (input) invite.mutate(input, { onSuccess: onSent, onError: form.showServerError });
        });
      }}
    >
      <div className="sm:col-span-3"><FormMessage message={form.formError} /></div>
      <TextField label="E-mail" name="email" type="email" value={form.values.email} onChange={(e) => form.set('email', e.target.value)} errors={form.errors.email} />
      <TextField label="Name" name="name" value={form.values.name} onChange={(e) => form.set('name', e.target.value)} errors={form.errors.name} />
      <SelectField label="Role" name="role" value={form.values.role} onChange={(e) => form.set('role', e.target.value)} errors={form.errors.role} options={ROLES.map((r) => ({ value: r, label: capitalise(r) }))} />
      <FormActions className="sm:col-span-3" label="Send invitation" busy={invite.isPending} busyLabel="Sending…" onCancel={onCancel} />
    </form>
  );
}
