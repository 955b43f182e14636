import type { OutboxMessageDto } from '../../../../shared/schemas/alerts';
import { Button } from '../../../components/button';
import { type Column, DataTable } from '../../../components/data-table';
import { formatDateTime } from '../../../lib/format';
import { useRetryMessage } from '../api/alerts';

export const OUTBOX_SORT_FIELDS = [
  { key: 'createdAt', label: 'Written' },
  { key: 'attempts', label: 'Attempts' },
  { key: 'sentAt', label: 'Sent' },
];

const STATUS_WORDS: Record<OutboxMessageDto['status'], string> = { pending: 'Waiting', sent: 'Sent', failed: 'Failed' };

function RetryButton({ message }: { message: OutboxMessageDto }) {
  const retry = useRetryMessage();
  if (!message.abilities.retry) return null;
  return (
    <Button onClick={() => retry.mutate(message.id)} disabled={retry.isPending}>
      {retry.isPending ? 'Retrying…' : 'Retry'}
    </Button>
  );
}

/** Outgoing mail: to whom, what, and whether the mail server took it. */
export function OutboxTable({ messages, sort, onSort }: { messages: OutboxMessageDto[]; sort?: string; onSort: (sort: string) => void }) {
  const columns: Column<OutboxMessageDto>[] = [
    { key: 'createdAt', header: 'Written', sortKey: 'createdAt', render: (m) => formatDateTime(m.createdAt) },
    { key: 'kind', header: 'Kind', render: (m) => m.kind },
    { key: 'recipient', header: 'To', render: (m) => <span title={m.recipient.address}>{m.recipient.name ?? m.recipient.address}</span> },
    { key: 'subject', header: 'Subject', render: (m) => m.subject },
    {
      key: 'status',
      header: 'Status',
      render: (m) => (
        <span title={m.lastError ?? undefined}>
          {STATUS_WORDS[m.status]}
          {m.status === 'pending' && m.attempts > 0 ? `, next try ${formatDateTime(m.nextAttemptAt)}` : ''}
        </span>
      ),
    },
    { key: 'attempts', header: 'Attempts', sortKey: 'attempts', align: 'right', render: (m) => m.attempts },
    { key: 'sentAt', header: 'Sent', sortKey: 'sentAt', render: (m) => (m.sentAt ? formatDateTime(m.sentAt) : '—') },
    { key: 'retry', header: '', render: (m) => <RetryButton message={m} /> },
  ];
  return <DataTable rows={messages} columns={columns} rowKey={(m) => m.id} caption="Outgoing mail" sort={sort} onSort={onSort} testId="outbox-table" />;
}
