import { Link } from 'react-router-dom';
import { EmptyState } from '../../../components/empty-state';
import { formatDateTime, formatDuration } from '../../../lib/format';
import { paths } from '../../../lib/paths';
import { useNow } from '../../../lib/use-now';
import type { OpenOutage } from '../api/overview';

/** The nodes down right now, widest blast radius first (the server's order), each with a way to its page. */
export function OpenOutages({ outages }: { outages: OpenOutage[] }) {
  const now = useNow();
  if (outages.length === 0) return <EmptyState title="No open outages">Every node you look after is reporting or was never set up.</EmptyState>;
  return (
    <ul data-testid="overview-open-outages" className="divide-y divide-line rounded-lg border border-line bg-surface text-sm">
      {outages.map((outage) => (
        <li key={outage.id} className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1 px-3 py-2">
          <Link to={paths.nodeDetail.to(outage.nodeId)} className="font-medium text-accent hover:underline">
            {outage.nodeName}
          </Link>
          <span className="text-muted">
            down {formatDuration((now - Date.parse(outage.startedAt)) / 1000)}, since{' '}
            <time dateTime={outage.startedAt}>{formatDateTime(outage.startedAt)}</time>
          </span>
          {(outage.blastNodeCount ?? 0) > 0 && (
            <span data-testid={`blast-radius-${outage.id}`} className="font-medium">
              {outage.blastNodeCount} {outage.blastNodeCount === 1 ? 'node' : 'nodes'} cut off behind it
              {(outage.blastClients ?? 0) > 0 && `, ${outage.blastClients} ${outage.blastClients === 1 ? 'client' : 'clients'}`}
            </span>
          )}
          <span className={outage.acknowledged ? 'text-muted' : 'font-medium'}>{outage.acknowledged ? 'Acknowledged' : 'Not acknowledged'}</span>
        </li>
      ))}
    </ul>
  );
}
