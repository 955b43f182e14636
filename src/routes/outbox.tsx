import { ListBody } from '../components/list-body';
import { FilterSelect, sortChoices } from '../components/list-toolbar';
import { PageHeader } from '../components/page-header';
import { useMailInbox, useOutbox } from '../features/alerts/api/alerts';
import { OUTBOX_SORT_FIELDS, OutboxTable } from '../features/alerts/components/outbox-table';
import { useListParams } from '../lib/list-params';
import { OUTBOX_KINDS, OUTBOX_STATUSES } from '../../shared/enums';

const STATUS_OPTIONS = OUTBOX_STATUSES.map((s) => ({ value: s, label: s[0].toUpperCase() + s.slice(1) }));
const KIND_OPTIONS = OUTBOX_KINDS.map((k) => ({ value: k, label: k }));

/** Admins: every outgoing mail, whether it went out, and retry for the ones that failed. */
export function OutboxPage() {
  const list = useListParams(['status', 'kind'], '-createdAt');
  const outbox = useOutbox(list.apiParams);
  const inbox = useMailInbox();
  const filtered = Boolean(list.filters.status || list.filters.kind);

  return (
    <>
      <PageHeader
        title="Outbox"
        subtitle="Mail Parapet has written: it is kept here until the mail server accepts it, and retried with growing pauses if not."
      />
      <div className="mb-3 flex flex-wrap items-end gap-3">
        <FilterSelect
          label="Status"
          value={list.filters.status}
          onChange={(status) => list.update({ status })}
          options={STATUS_OPTIONS}
          allLabel="Every status"
        />
        <FilterSelect label="Kind" value={list.filters.kind} onChange={(kind) => list.update({ kind })} options={KIND_OPTIONS} allLabel="Every kind" />
        <div className="sm:hidden">
          <FilterSelect
            label="Sort by"
            value={list.sort}
            onChange={(sort) => list.update({ sort })}
            options={sortChoices(OUTBOX_SORT_FIELDS)}
            allLabel="Newest first"
          />
        </div>
        {inbox.data && (
          <a className="pb-1.5 text-sm font-medium text-accent hover:underline" href={inbox.data.url} target="_blank" rel="noreferrer">
            Open the test inbox (development)
          </a>
        )}
      </div>
      <ListBody
        query={outbox}
        noun="messages"
        emptyTitle={filtered ? 'No messages match' : 'No mail written yet'}
        emptyHint={filtered ? 'Try another status or kind.' : 'Mail is written when a node goes offline, comes back, or stays degraded.'}
        onPage={(page) => list.update({ page })}
        onPageSize={(pageSize) => list.update({ pageSize })}
      >
        {(rows) => <OutboxTable messages={rows} sort={list.sort} onSort={(sort) => list.update({ sort })} />}
      </ListBody>
    </>
  );
}
