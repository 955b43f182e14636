import { useCallback, useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import { DEFAULT_PAGE_SIZE, MAX_PAGE_SIZE, positiveInt } from './list-query';
import type { ListParams } from './query-keys';

export { DEFAULT_PAGE_SIZE };
export const PAGE_SIZES = [10, 25, 50, 100] as const;

export interface ListState {
  page: number;
  pageSize: number;
  sort: string | undefined;
  q: string;
  filters: Record<string, string | undefined>;
  /** What goes to the server: the same names as in the page's address, so links are shareable. */
  apiParams: ListParams;
  /** Change some parameters; any change other than the page itself goes back to page 1. */
  update: (changes: Record<string, string | number | undefined>, options?: { replace?: boolean }) => void;
}

export function useListParams(filterKeys: readonly string[], defaultSort?: string): ListState {
  const [searchParams, setSearchParams] = useSearchParams();
  const page = positiveInt(searchParams.get('page'), 1);
  const pageSize = positiveInt(searchParams.get('pageSize'), DEFAULT_PAGE_SIZE, MAX_PAGE_SIZE);
  const sort = searchParams.get('sort') ?? defaultSort;
  const q = searchParams.get('q') ?? '';
  // Serialised so the memo below changes only when a filter's value does.
  const filterJson = JSON.stringify(filterKeys.map((key) => [key, searchParams.get(key) ?? '']));
  const filters = useMemo(
    () => Object.fromEntries((JSON.parse(filterJson) as [string, string][]).map(([key, value]) => [key, value || undefined])),
    [filterJson],
  );

  // The same as listApiParams (list-query.ts) gives the server for this address, so a preloaded answer is reused.
  const apiParams = useMemo<ListParams>(() => ({ page, pageSize, sort, q: q.trim() || undefined, ...filters }), [page, pageSize, sort, q, filters]);

  const update = useCallback<ListState['update']>(
    (changes, options) => {
      setSearchParams(
        (previous) => {
          const next = new URLSearchParams(previous);
          for (const [key, value] of Object.entries(changes)) {
            if (value === undefined || value === '') next.delete(key);
            else next.set(key, String(value));
          }
          if (!('page' in changes)) next.delete('page');
          return next;
        },
        { replace: options?.replace ?? false },
      );
    },
    [setSearchParams],
  );

  return { page, pageSize, sort, q, filters, apiParams, update };
}
