import { useMutation, useQueryClient } from '@tanstack/react-query';
import { invitationCreateSchema } from '../../../../shared/schemas/account';
import { FormMessage, TextField, FormActions } from '../../../components/form-field';
import { api } from '../../../lib/api';
import { useSchemaForm } from '../../../lib/schema-form';
import { siteKeys } from '../../../lib/query-keys';

/**
 * A new host for this site, invited by e-mail: they choose their own password from the link and
 * become the site's host. Operators can name only people already hosting nearby; everyone else comes this way.
 */
export function InviteHostForm({ siteId, onSent, onCancel }: { siteId: number; onSent: (email: string) => void; onCancel: () => void }) {
  const form = useSchemaForm({
    defaultValues: { email: '', name: '' },
    schema: invitationCreateSchema,
    toInput: (values) => ({ ...values, role: 'host', siteId }),
  });
  const queryClient = useQueryClient();
  const invite = useMutation({
    mutationFn: (body: { email: string; name: string; role: 'host'; siteId: number }) => api.post('/invitations', body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: siteKeys.all }),
  });
  const submit = form.handleSubmit(({ email, name }) =>
    invite.mutate({ email, name, role: 'host', siteId }, { onSuccess: () => onSent(email), onError: form.showServerError }),
  );
  return (
    <form noValidate data-testid="invite-host-form" aria-label="Invite a new host" className="grid max-w-2xl gap-4 sm:grid-cols-2" onSubmit={submit}>
      <div className="sm:col-span-2">
        <FormMessage message={form.formError} />
      </div>
      <TextField label="Host's e-mail" type="email" {...form.field('email')} />
      <TextField label="Host's name" {...form.field('name')} />
      <FormActions className="sm:col-span-2" label="Send invitation" busy={invite.isPending} busyLabel="Sending…" onCancel={onCancel} />
    </form>
  );
}
