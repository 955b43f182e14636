import { LoadError, Loading } from '../../../components/query-state';
import { formatPercent } from '../../../lib/format';
import { useNodeAvailability, type NodeAvailability as Availability } from '../api/telemetry';

const WINDOWS: { key: keyof Availability; label: string }[] = [
  { key: 'h24', label: '24 hours' },
  { key: 'd7', label: '7 days' },
  { key: 'd30', label: '30 days' },
  { key: 'd90', label: '90 days' },
];

/** Time up ÷ time observed in each window, from the node's outages. */
export function NodeAvailability({ nodeId }: { nodeId: number }) {
  const availability = useNodeAvailability(nodeId);
  if (availability.isPending) return <Loading label="Loading availability…" />;
  if (availability.isError) return <LoadError error={availability.error} />;
  return (
    <dl data-testid="node-availability" className="grid grid-cols-2 gap-2 sm:grid-cols-4">
      {WINDOWS.map((w) => (
        <div key={w.key} className="rounded-lg border border-line bg-surface px-3 py-2">
          <dt className="text-xs font-medium tracking-wide text-muted uppercase">{w.label}</dt>
          <dd className={`mt-0.5 text-lg font-semibold tabular-nums ${availability.data[w.key] === null ? 'text-muted' : ''}`}>
            {formatPercent(availability.data[w.key])}
          </dd>
        </div>
      ))}
    </dl>
  );
}
