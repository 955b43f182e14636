import { Link } from 'react-router-dom';
import type { OutageDto } from '../../../../shared/schemas/outage';
import { Button } from '../../../components/button';
import { DataTable, type Column } from '../../../components/data-table';
import { formatDateTime, formatDuration, formatSince } from '../../../lib/format';
import { paths } from '../../../lib/paths';
import { useNow } from '../../../lib/use-now';
import { useAcknowledgeOutage } from '../api/outages';
import { OutageNotes } from './outage-notes';

export const OUTAGE_SORT_FIELDS = [
  { key: 'startedAt', label: 'Started' },
  { key: 'endedAt', label: 'Ended' },
  { key: 'acknowledgedAt', label: 'Acknowledged' },
];

function Acknowledgement({ outage }: { outage: OutageDto }) {
  const acknowledge = useAcknowledgeOutage();
  if (outage.acknowledgedAt) {
    return (
      <span title={formatDateTime(outage.acknowledgedAt)}>
        {outage.acknowledgedBy?.name ?? 'Someone'}, {formatSince(outage.acknowledgedAt)}
      </span>
    );
  }
  if (outage.endedAt) return <span className="text-muted">Not acknowledged</span>;
  if (!outage.abilities.acknowledge) return <span className="text-muted">Not yet</span>;
  return (
    <span className="inline-flex flex-col items-end gap-1 sm:items-start">
      <Button data-testid={`acknowledge-${outage.id}`} onClick={() => acknowledge.mutate(outage.id)} disabled={acknowledge.isPending}>
        {acknowledge.isPending ? 'Acknowledging…' : 'Acknowledge'}
        <span className="sr-only"> the outage of {outage.nodeName}</span>
      </Button>
      {acknowledge.isError && (
        <span role="alert" className="text-xs text-danger">
          {acknowledge.error.message}
        </span>
      )}
    </span>
  );
}

/** The nodes cut off behind this one: one outage with its reach, not one per silent node. */
function BlastRadius({ outage }: { outage: OutageDto }) {
  const blast = outage.blastRadius;
  if (!blast || blast.nodeCount === 0) return null;
  const clients = blast.clients > 0 ? `, ${blast.clients} client${blast.clients === 1 ? '' : 's'}` : '';
  return (
    <span className="block text-xs text-muted">
      {blast.nodeCount} node{blast.nodeCount === 1 ? '' : 's'} cut off behind it{clients}
    </span>
  );
}

function duration(outage: OutageDto, now: number): string {
  if (outage.endedAt) return formatDuration(outage.durationS);
  return `${formatDuration((now - Date.parse(outage.startedAt)) / 1000)} so far`;
}

interface OutagesTableProps {
  outages: OutageDto[];
  neighbourhoodNames?: Map<number, string>;
  /** Off on a node's own page, where every row is that node. */
  showNode?: boolean;
  sort?: string;
  onSort?: (sort: string) => void;
  testId?: string;
}

export { Acknowledgement, BlastRadius };

export function OutagesTable({ outages, neighbourhoodNames, showNode = true, sort, onSort, testId = 'outages-table' }: OutagesTableProps) {
  const now = useNow();
  const columns: Column<OutageDto>[] = [
    ...(showNode
      ? [
          {
            key: 'node',
            header: 'Node',
            render: (o: OutageDto) => (
              <span>
                <Link to={paths.nodeDetail.to(o.nodeId)} className="font-medium text-accent hover:underline">
                  {o.nodeName}
                </Link>
                <BlastRadius outage={o} />
              </span>
            ),
          },
        ]
      : []),
    ...(showNode && neighbourhoodNames
      ? [{ key: 'neighbourhood', header: 'Neighbourhood', render: (o: OutageDto) => neighbourhoodNames.get(o.neighbourhoodId) ?? `#${o.neighbourhoodId}` }]
      : []),
    {
      key: 'startedAt',
      header: 'Started',
      sortKey: 'startedAt',
      render: (o) => (
        <Link to={paths.outageDetail.to(o.id)} className="text-accent hover:underline" data-testid={`outage-link-${o.id}`}>
          <time dateTime={o.startedAt}>{formatDateTime(o.startedAt)}</time>
        </Link>
      ),
    },
    {
      key: 'endedAt',
      header: 'Ended',
      sortKey: 'endedAt',
      render: (o) => (o.endedAt ? <time dateTime={o.endedAt}>{formatDateTime(o.endedAt)}</time> : <span className="font-medium text-danger">Still down</span>),
    },
    { key: 'duration', header: 'Duration', render: (o) => duration(o, now) },
    { key: 'acknowledgedAt', header: 'Acknowledged', sortKey: 'acknowledgedAt', render: (o) => <Acknowledgement outage={o} /> },
    { key: 'notes', header: 'Notes', render: (o) => <OutageNotes outage={o} /> },
  ];
  return <DataTable testId={testId} caption="Outages" rows={outages} columns={columns} rowKey={(o) => o.id} sort={sort} onSort={onSort} />;
}
