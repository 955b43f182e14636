import { useState } from 'react';
import { Button } from '../../../components/button';
import { Section } from '../../../components/page-header';
import { LoadError, Loading } from '../../../components/query-state';
import { useHistory } from '../api/history';
import { HistoryList } from './history-list';

type AuditedTable = 'sites' | 'nodes' | 'radios' | 'links' | 'neighbourhoods' | 'users';

/** A record's change history, for record pages: who changed what and when, newest first. */
export function HistorySection({ table, recordId }: { table: AuditedTable; recordId: number }) {
  const [pageSize, setPageSize] = useState(10);
  const history = useHistory({ table, recordId, pageSize });
  return (
    <Section title="History">
      {history.isPending ? (
        <Loading label="Loading the history…" />
      ) : history.isError ? (
        <LoadError error={history.error} />
      ) : history.data.data.length === 0 ? (
        <p className="text-sm text-muted">No changes recorded yet.</p>
      ) : (
        <>
          <HistoryList entries={history.data.data} />
          {history.data.pagination.total > history.data.data.length && (
            <Button className="mt-3" onClick={() => setPageSize((n) => n + 20)}>
              Show older changes
            </Button>
          )}
        </>
      )}
    </Section>
  );
}
