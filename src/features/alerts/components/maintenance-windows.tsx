import { maintenanceWindowCreateSchema, type MaintenanceWindowDto } from '../../../../shared/schemas/alerts';
import { Button } from '../../../components/button';
import { Caution } from '../../../components/caution';
import { FormMessage, TextField, FormActions } from '../../../components/form-field';
import { LoadError, Loading } from '../../../components/query-state';
import { formatDateTime } from '../../../lib/format';
import { useSchemaForm } from '../../../lib/schema-form';
import { useAnnounceMaintenance, useCancelMaintenance, useMaintenanceWindows } from '../api/alerts';

const STATUS_WORDS: Record<MaintenanceWindowDto['status'], string> = { upcoming: 'Planned', active: 'Now', over: 'Over', cancelled: 'Cancelled' };

// datetime-local inputs read in the browser's own time; the API takes UTC.
const toIso = (local: string) => (local ? new Date(local).toISOString() : '');

/** Announced maintenance for one node: while a window is open the node shows maintenance and nobody is mailed. */
export function MaintenanceWindows({ nodeId }: { nodeId: number }) {
  const windows = useMaintenanceWindows(nodeId);
  const announce = useAnnounceMaintenance(nodeId);
  const cancel = useCancelMaintenance(nodeId);
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

  if (windows.isPending) return <Loading label="Loading maintenance windows…" />;
  if (windows.isError) return <LoadError error={windows.error} />;
  const rows = windows.data.data.filter((w) => w.status === 'upcoming' || w.status === 'active');

  return (
    <section aria-labelledby={`maintenance-${nodeId}`} className="space-y-3" data-testid="maintenance-windows">
      <h2 id={`maintenance-${nodeId}`} className="text-base font-semibold">
        Planned maintenance
      </h2>
      {rows.length === 0 ? (
        <p className="text-sm text-muted">Nothing announced. Announce a window before switching the node off, so nobody is alarmed.</p>
      ) : (
        <ul className="divide-y divide-line rounded-md border border-line">
          {rows.map((w) => (
            <li key={w.id} className="flex flex-wrap items-center gap-3 px-3 py-2 text-sm">
              <span className="font-medium">{STATUS_WORDS[w.status]}</span>
              <span>
                {formatDateTime(w.startsAt)} – {formatDateTime(w.endsAt)}
              </span>
              {w.reason && <span className="text-muted">{w.reason}</span>}
              {w.createdBy && <span className="text-muted">by {w.createdBy.name}</span>}
              {w.abilities.cancel && (
                <Button className="ml-auto" onClick={() => cancel.mutate(w.id)} disabled={cancel.isPending}>
                  Cancel window
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
      {windows.data.abilities.create && (
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
      )}
    </section>
  );
}
