import { useMutation, useQueryClient } from '@tanstack/react-query';
import { invitationCreateSchema } from '../../../../shared/schemas/account';
import { FormMessage, TextField, FormActions } from '../../../components/form-field';
import { api } from '../../../lib/api';
import { useForm } from '../../../lib/form';
import { siteKeys } from '../../../lib/query-keys';

/**
 * A new host for this site, invited by e-mail: they choose their own password from the link and
 * become the site's host. Operators can name only people already hosting nearby; everyone else comes this way.
 */
export function InviteHostForm({ siteId, onSent, onCancel }: { siteId: number; onSent: (email: string) => void; onCancel: () => void }) {
  const form = useForm({ email: '', name: '' });
  const queryClient = useQueryClient();
  const invite = useMutation({
    mutationFn: (body: { email: string; name: string; role: 'host'; siteId: number }) => api.post('/invitations', body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: siteKeys.all }),
  });
  return (
    <form
      noValidate
      data-testid="invite-host-form"
      aria-label="Invite a new host"
      className="grid max-w-2xl gap-4 sm:grid-cols-2"
      onSubmit={(event) => {
        event.preventDefault();
        const input = form.check(invitationCreateSchema, { ...form.values, role: 'host', siteId });
        if (input) invite.mutate({ email: input.email, name: input.name, role: 'host', siteId }, { onSuccess: () => onSent(input.email), onError: form.showServerError });
      }}
    >
      <div className="sm:col-span-2"><FormMessage message={form.formError} /></div>
      <TextField label="Host's e-mail" name="email" type="email" value={form.values.email} onChange={(e) => form.set('email', e.target.value)} errors={form.errors.email} />
      <TextField label="Host's name" name="name" value={form.values.name} onChange={(e) => form.set('name', e.target.value)} errors={form.errors.name} />
      <FormActions className="sm:col-span-2" label="Send invitation" busy={invite.isPending} busyLabel="Sending…" onCancel={onCancel} />
    </form>
  );
}
