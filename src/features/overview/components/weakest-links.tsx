import { Link } from 'react-router-dom';
import { EmptyState } from '../../../components/empty-state';
import { paths } from '../../../lib/paths';
import type { WeakLink } from '../api/overview';

const dbm = (v: number | null) => (v === null ? '—' : `${v.toFixed(1)} dBm`);

/** Live links with the thinnest predicted fade margin: the first to fail in rain or when an antenna moves. */
export function WeakestLinks({ links }: { links: WeakLink[] }) {
  if (links.length === 0) return <EmptyState title="No live links to rank">Links appear here once they are live.</EmptyState>;
  return (
    <ul data-testid="overview-weakest-links" className="divide-y divide-line rounded-lg border border-line bg-surface text-sm">
      {links.map((l) => (
        <li key={l.id} className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1 px-3 py-2">
          <span>
            <Link to={paths.nodeDetail.to(l.nodeAId)} className="font-medium text-accent hover:underline">
              {l.nodeAName}
            </Link>
            {' – '}
            <Link to={paths.nodeDetail.to(l.nodeBId)} className="font-medium text-accent hover:underline">
              {l.nodeBName}
            </Link>
          </span>
          <span className="tabular-nums">fade margin {l.fadeMarginDb.toFixed(1)} dB</span>
          <span className="text-muted tabular-nums">
            predicted {dbm(l.predictedSignalDbm)}, measured {dbm(l.measuredSignalDbm)}
          </span>
        </li>
      ))}
    </ul>
  );
}
