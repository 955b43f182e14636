import { ROLES } from '../../../../shared/enums';
import type { UserDto } from '../../../../shared/schemas/user';
import { FormMessage, SelectField, TextField, FormActions } from '../../../components/form-field';
import { capitalise } from '../../../lib/format';
import { lazySchema, useSchemaForm } from '../../../lib/schema-form';
import { useInvite } from '../api/account';

// Its module also holds the password rules and their dictionary: fetched when the form is first used.
const loadSchema = lazySchema(() => import('../../../../shared/schemas/account').then((m) => m.invitationCreateSchema));

/** An admin invites someone by e-mail; they choose their own password from the link. */
export function InviteForm({ onSent, onCancel }: { onSent: (person: UserDto & { invitationExpiresAt: string }) => void; onCancel: () => void }) {
  const form = useSchemaForm({ defaultValues: { email: '', name: '', role: 'host' }, schema: loadSchema });
  const invite = useInvite();
  const submit = form.handleSubmit((input) => invite.mutate(input, { onSuccess: onSent, onError: form.showServerError }));
  return (
    <form
      noValidate
      data-testid="invite-form"
      className="grid max-w-2xl gap-4 sm:grid-cols-3"
      onFocus={() => void loadSchema().catch(() => undefined)}
      onSubmit={submit}
    >
      <div className="sm:col-span-3">
        <FormMessage message={form.formError} />
      </div>
      <TextField label="E-mail" type="email" {...form.field('email')} />
      <TextField label="Name" {...form.field('name')} />
      <SelectField label="Role" {...form.field('role')} options={ROLES.map((r) => ({ value: r, label: capitalise(r) }))} />
      <FormActions className="sm:col-span-3" label="Send invitation" busy={invite.isPending} busyLabel="Sending…" onCancel={onCancel} />
    </form>
  );
}
