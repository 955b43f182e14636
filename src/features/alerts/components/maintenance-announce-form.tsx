import { maintenanceWindowCreateSchema } from '../../../../shared/schemas/alerts';
import { Caution } from '../../../components/caution';
import { FormMessage, TextField, FormActions } from '../../../components/form-field';
import { useSchemaForm } from '../../../lib/schema-form';
import { useAnnounceMaintenance } from '../api/alerts';

// datetime-local inputs read in the browser's own time; the API takes UTC.
const toIso = (local: string) => (local ? new Date(local).toISOString() : '');

/** Announces a maintenance window for one node, checked with the server's own schema. */
export function MaintenanceAnnounceForm({ nodeId }: { nodeId: number }) {
  const announce = useAnnounceMaintenance(nodeId);
  const form = useSchemaForm({
    defaultValues: { startsAt: '', endsAt: '', reason: '' },
    schema: maintenanceWindowCreateSchema,
    toInput: (values) => ({ startsAt: toIso(values.startsAt), endsAt: toIso(values.endsAt), ...(values.reason.trim() ? { reason: values.reason } : {}) }),
  });
  const submit = form.handleSubmit(async (body) => {
    try {
      await announce.mutateAsync(body);
      form.reset();
    } catch (error) {
      form.showServerError(error);
    }
  });

  return (
    <form onSubmit={submit} noValidate className="grid gap-3 sm:grid-cols-2">
      <TextField label="Starts" type="datetime-local" {...form.field('startsAt')} />
      <TextField label="Ends" type="datetime-local" {...form.field('endsAt')} />
      <div className="sm:col-span-2">
        <TextField label="Reason (optional)" maxLength={500} {...form.field('reason')} />
      </div>
      <div className="sm:col-span-2 space-y-2">
        <Caution>
          Switching off roof equipment can mean ladders, roofs and mains power. Follow local rules and leave that work to people trained or licensed for it.
        </Caution>
        <FormMessage message={form.formError} />
        <FormActions label="Announce maintenance" busy={announce.isPending} busyLabel="Announcing…" />
      </div>
    </form>
  );
}
