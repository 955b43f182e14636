import type { ReactNode } from 'react';
import type { ListResponse } from '../lib/resource';
import { EmptyState } from './empty-state';
import { Pagination } from './pagination';
import { LoadError, Loading } from './query-state';

interface ListBodyProps<T> {
  query: { isPending: boolean; error: unknown; data: ListResponse<T> | undefined; isPlaceholderData?: boolean };
  noun: string;
  emptyTitle: string;
  emptyHint?: ReactNode;
  onPage: (page: number) => void;
  onPageSize: (pageSize: number) => void;
  children: (rows: T[]) => ReactNode;
}

/** Loading, failure, nothing found, or the rows and their pages: the same four states on every list. */
export function ListBody<T>({ query, noun, emptyTitle, emptyHint, onPage, onPageSize, children }: ListBodyProps<T>) {
  if (query.isPending) return <Loading label={`Loading ${noun}…`} />;
  if (query.error && !query.data) return <LoadError error={query.error} />;
  if (!query.data) return null;
  const { data: rows, pagination } = query.data;
  return (
    <div aria-busy={query.isPlaceholderData || undefined} className={query.isPlaceholderData ? 'opacity-70 transition-opacity' : ''}>
      {query.error ? <LoadError error={query.error} /> : null}
      {rows.length === 0 ? <EmptyState title={emptyTitle}>{emptyHint}</EmptyState> : children(rows)}
      {pagination.total > 0 && <Pagination pagination={pagination} noun={noun} onPage={onPage} onPageSize={onPageSize} />}
    </div>
  );
}
