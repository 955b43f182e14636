import type { HostedNodeDto } from '../../../../shared/schemas/account';
import { StateBadge } from '../../../components/state-badge';
import { formatDateTime, formatDuration, formatPercent } from '../../../lib/format';

function outageLine(o: HostedNodeDto['recentOutages'][number]): string {
  const start = formatDateTime(o.startedAt);
  if (!o.endedAt) return `Down since ${start}${o.acknowledged ? ' — an operator is on it' : ''}`;
  const s = (new Date(o.endedAt).getTime() - new Date(o.startedAt).getTime()) / 1000;
  return `${start}, down for ${formatDuration(s)}`;
}

/** One node in words first, figures second: a resident should not need to read a chart. */
export function HostedNode({ node }: { node: HostedNodeDto }) {
  return (
    <div data-testid={`hosted-node-${node.id}`} className="space-y-3">
      <div className="flex flex-wrap items-center gap-2">
        <h3 className="text-base font-semibold">{node.name}</h3>
        <StateBadge state={node.state} />
      </div>
      <p className="text-base" data-testid="health-summary">
        {node.summary}
      </p>
      <dl className="grid grid-cols-2 gap-2 text-sm">
        <div className="rounded-md border border-line p-2">
          <dt className="text-muted">Working, last 30 days</dt>
          <dd className="text-lg font-semibold tabular-nums">{formatPercent(node.availability.d30Pct)}</dd>
        </div>
        <div className="rounded-md border border-line p-2">
          <dt className="text-muted">Working, last 24 hours</dt>
          <dd className="text-lg font-semibold tabular-nums">{formatPercent(node.availability.h24Pct)}</dd>
        </div>
      </dl>
      <div>
        <h4 className="mb-1 text-sm font-semibold">Recent outages</h4>
        {node.recentOutages.length === 0 ? (
          <p className="text-sm text-muted">None recorded.</p>
        ) : (
          <ul className="space-y-1 text-sm">
            {node.recentOutages.map((o) => (
              <li key={o.id}>{outageLine(o)}</li>
            ))}
          </ul>
        )}
      </div>
    </div>
  );
}
