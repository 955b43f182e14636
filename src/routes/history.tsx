import { AUDITED_TABLE_NAMES } from '../../shared/schemas/auditTables';
import { ListBody } from '../components/list-body';
import { FilterSelect } from '../components/list-toolbar';
import { PageHeader } from '../components/page-header';
import { useHistory } from '../features/history/api/history';
import { HistoryList } from '../features/history/components/history-list';
import { useListParams } from '../lib/list-params';

/** Admins: every recorded change to the inventory and to people. */
export function HistoryPage() {
  const list = useListParams(['table', 'recordId'], '');
  const history = useHistory({ ...list.apiParams, sort: undefined, q: undefined });
  return (
    <>
      <PageHeader
        title="History"
        subtitle="Every change to sites, nodes, radios, links, neighbourhoods and people: who, when and what. Keys and passwords are never shown."
      />
      <div className="mb-4 max-w-xs">
        <FilterSelect
          label="Kind of record"
          value={list.filters.table}
          onChange={(table) => list.update({ table, recordId: undefined })}
          options={AUDITED_TABLE_NAMES.map((t) => ({ value: t, label: t }))}
        />
      </div>
      <ListBody
        query={history}
        noun="changes"
        emptyTitle="No changes recorded"
        onPage={(page) => list.update({ page })}
        onPageSize={(pageSize) => list.update({ pageSize })}
      >
        {(rows) => <HistoryList entries={rows} showRecord />}
      </ListBody>
    </>
  );
}
