import { Link } from 'react-router-dom';
import type { NodeDto } from '../../../../shared/schemas/node';
import { DataTable, type Column } from '../../../components/data-table';
import { StateBadge } from '../../../components/state-badge';
import { formatDateTime, formatSince } from '../../../lib/format';
import { paths } from '../../../lib/paths';

interface NodesTableProps {
  nodes: NodeDto[];
  siteNames: Map<number, string>;
  neighbourhoodNames: Map<number, string>;
  sort?: string;
  onSort?: (sort: string) => void;
}

export const NODE_SORT_FIELDS = [
  { key: 'name', label: 'Name' },
  { key: 'state', label: 'State' },
  { key: 'lastSeenAt', label: 'Last report' },
];

export function NodesTable({ nodes, siteNames, neighbourhoodNames, sort, onSort }: NodesTableProps) {
  const columns: Column<NodeDto>[] = [
    {
      key: 'name',
      header: 'Name',
      sortKey: 'name',
      render: (node) => (
        <Link to={paths.nodeDetail.to(node.id)} className="font-medium text-accent hover:underline">
          {node.name}
          {node.isUplink && <span className="ml-1.5 rounded bg-accent-soft px-1.5 py-0.5 text-xs font-normal text-ink">uplink</span>}
        </Link>
      ),
    },
    { key: 'state', header: 'State', sortKey: 'state', render: (node) => <StateBadge state={node.state} /> },
    { key: 'site', header: 'Site', render: (node) => siteNames.get(node.siteId) ?? `#${node.siteId}` },
    { key: 'neighbourhood', header: 'Neighbourhood', render: (node) => neighbourhoodNames.get(node.neighbourhoodId) ?? `#${node.neighbourhoodId}` },
    {
      key: 'lastSeenAt',
      header: 'Last report',
      sortKey: 'lastSeenAt',
      render: (node) => (
        <time dateTime={node.lastSeenAt ?? undefined} title={formatDateTime(node.lastSeenAt)}>
          {formatSince(node.lastSeenAt)}
        </time>
      ),
    },
    { key: 'firmware', header: 'Firmware', render: (node) => node.firmware ?? '—' },
  ];
  return <DataTable testId="nodes-table" caption="Nodes" rows={nodes} columns={columns} rowKey={(node) => node.id} sort={sort} onSort={onSort} />;
}
