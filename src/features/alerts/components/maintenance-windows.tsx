import { lazy, Suspense } from 'react';
import type { MaintenanceWindowDto, MaintenanceWindowsBody } from '../../../../shared/schemas/alerts';
import { Button } from '../../../components/button';
import { LoadError, Loading } from '../../../components/query-state';
import { formatDateTime } from '../../../lib/format';
import { useCancelMaintenance, useMaintenanceWindows } from '../api/alerts';

// The form (its form library and the shared schemas, about 40 KB) loads after the list is drawn.
const MaintenanceAnnounceForm = lazy(() => import('./maintenance-announce-form').then((m) => ({ default: m.MaintenanceAnnounceForm })));

const STATUS_WORDS: Record<MaintenanceWindowDto['status'], string> = { upcoming: 'Planned', active: 'Now', over: 'Over', cancelled: 'Cancelled' };

/**
 * Announced maintenance for one node: while a window is open the node shows maintenance and nobody is mailed.
 * `initial`: the node's windows as another answer already carried them, and when it arrived.
 */
export function MaintenanceWindows({ nodeId, initial }: { nodeId: number; initial?: { body: MaintenanceWindowsBody; at: number } }) {
  const windows = useMaintenanceWindows(nodeId, initial);
  const cancel = useCancelMaintenance(nodeId);

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
        <Suspense fallback={null}>
          <MaintenanceAnnounceForm nodeId={nodeId} />
        </Suspense>
      )}
    </section>
  );
}
