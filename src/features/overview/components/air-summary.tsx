import { Link } from 'react-router-dom';
import { formatDateTime } from '../../../lib/format';
import { paths } from '../../../lib/paths';
import type { Overview } from '../api/overview';

/** Where the air and the inventory disagree: links nobody has heard for a day, unlisted pairs, radios that moved. */
export function AirSummary({ overview }: { overview: Overview }) {
  const silent = overview.silentLinks ?? [];
  const moves = overview.radioMoves ?? [];
  const discovered = overview.discoveredLinkCount ?? 0;
  return (
    <ul data-testid="overview-air" className="divide-y divide-line rounded-lg border border-line bg-surface text-sm">
      {silent.map((l) => (
        <li key={`silent-${l.id}`} className="px-3 py-2">
          <span className="font-medium">Planned but silent:</span>{' '}
          <Link to={paths.nodeDetail.to(l.nodeAId)} className="text-accent hover:underline">
            {l.nodeAName}
          </Link>{' '}
          ↔{' '}
          <Link to={paths.nodeDetail.to(l.nodeBId)} className="text-accent hover:underline">
            {l.nodeBName}
          </Link>
          <span className="text-muted"> · {l.status}, not heard on the air for a day</span>
        </li>
      ))}
      {moves.map((m) => (
        <li key={`move-${m.id}`} className="px-3 py-2">
          <span className="font-medium">Radio moved:</span> <code>{m.mac}</code> from {m.fromNodeName} to{' '}
          <Link to={paths.nodeDetail.to(m.toNodeId)} className="text-accent hover:underline">
            {m.toNodeName}
          </Link>
          <span className="text-muted"> · {formatDateTime(m.at)}</span>
        </li>
      ))}
      {discovered > 0 && (
        <li className="px-3 py-2">
          {discovered === 1 ? 'One pair of radios talks' : `${discovered} pairs of radios talk`} without a link in the inventory.{' '}
          <Link to={paths.topology.to()} className="font-medium text-accent hover:underline">
            See them on the map
          </Link>
        </li>
      )}
    </ul>
  );
}
