import type { HistoryEntryDto } from '../../../../shared/schemas/account';
import { formatDateTime } from '../../../lib/format';

const ACTION_WORDS = { create: 'added', update: 'changed', delete: 'removed' } as const;

const show = (v: unknown) => (v === null || v === undefined ? '—' : typeof v === 'object' ? JSON.stringify(v) : String(v));

/** One line per change: who, when, and each changed field as "before → after". */
export function HistoryList({ entries, showRecord = false }: { entries: HistoryEntryDto[]; showRecord?: boolean }) {
  return (
    <ol className="space-y-3" data-testid="history-list">
      {entries.map((e) => {
        const fields = [...new Set([...Object.keys(e.before ?? {}), ...Object.keys(e.after ?? {})])];
        return (
          <li key={e.id} className="rounded-md border border-line p-3 text-sm">
            <p>
              <span className="font-medium">{e.changedBy?.name ?? 'Parapet'}</span> {ACTION_WORDS[e.action]}{' '}
              {showRecord ? `${e.table} #${e.recordId}` : 'this record'} · <time dateTime={e.changedAt}>{formatDateTime(e.changedAt)}</time>
              {e.reason ? ` · ${e.reason}` : ''}
            </p>
            {e.action === 'update' && (
              <ul className="mt-1 space-y-0.5 text-muted">
                {fields.map((f) => (
                  <li key={f} className="break-words">
                    <span className="font-mono text-ink">{f}</span>: {show(e.before?.[f])} → {show(e.after?.[f])}
                  </li>
                ))}
              </ul>
            )}
          </li>
        );
      })}
    </ol>
  );
}
