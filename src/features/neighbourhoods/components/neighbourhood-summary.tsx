import { Link } from 'react-router-dom';
import type { NeighbourhoodSummaryDto } from '../../../../shared/schemas/neighbourhood';
import { DataTable, type Column } from '../../../components/data-table';
import { EmptyState } from '../../../components/empty-state';
import { StateBadge } from '../../../components/state-badge';
import { formatPercent } from '../../../lib/format';
import { paths } from '../../../lib/paths';

type NodeRow = NeighbourhoodSummaryDto['nodes'][number];

export function AvailabilityFigures({ availability }: { availability: NeighbourhoodSummaryDto['availability'] }) {
  return (
    <dl className="grid max-w-md grid-cols-2 gap-2 text-sm" data-testid="neighbourhood-availability">
      <div className="rounded-md border border-line p-2">
        <dt className="text-muted">Availability, 24 hours</dt>
        <dd className="text-lg font-semibold tabular-nums">{formatPercent(availability.h24Pct)}</dd>
      </div>
      <div className="rounded-md border border-line p-2">
        <dt className="text-muted">Availability, 30 days</dt>
        <dd className="text-lg font-semibold tabular-nums">{formatPercent(availability.d30Pct)}</dd>
      </div>
    </dl>
  );
}

export function NeighbourhoodNodes({ nodes }: { nodes: NodeRow[] }) {
  if (nodes.length === 0) return <EmptyState title="No nodes in this neighbourhood yet" />;
  const columns: Column<NodeRow>[] = [
    {
      key: 'name',
      header: 'Node',
      render: (n) => (
        <Link to={paths.nodeDetail.to(n.id)} className="font-medium text-accent hover:underline">
          {n.name}
        </Link>
      ),
    },
    { key: 'state', header: 'State', render: (n) => <StateBadge state={n.state} /> },
    {
      key: 'site',
      header: 'Site',
      render: (n) => (
        <Link to={paths.siteDetail.to(n.siteId)} className="hover:underline">
          {n.siteName}
        </Link>
      ),
    },
    { key: 'h24', header: '24 h', align: 'right', render: (n) => formatPercent(n.availability.h24Pct) },
    { key: 'd30', header: '30 d', align: 'right', render: (n) => formatPercent(n.availability.d30Pct) },
  ];
  return <DataTable testId="neighbourhood-nodes" caption="Nodes in this neighbourhood" rows={nodes} columns={columns} rowKey={(n) => n.id} />;
}

export function NeighbourhoodHosts({ hosts }: { hosts: NeighbourhoodSummaryDto['hosts'] }) {
  if (hosts.length === 0) return <EmptyState title="No sites in this neighbourhood yet" />;
  return (
    <ul className="space-y-1 text-sm" data-testid="neighbourhood-hosts">
      {hosts.map((h) => (
        <li key={h.siteId}>
          <Link to={paths.siteDetail.to(h.siteId)} className="font-medium text-accent hover:underline">
            {h.siteName}
          </Link>
          : {h.host ? h.host.name : <span className="text-muted">no host recorded</span>}
        </li>
      ))}
    </ul>
  );
}
