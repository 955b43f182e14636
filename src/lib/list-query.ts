import type { ListParams } from './query-keys';

// How a page's address becomes the API query it sends: pure, so the server can name the same URLs in the page's HTML
// (src/app/page-data.ts) and the browser reuses those early answers instead of asking again.

export const DEFAULT_PAGE_SIZE = 25;
/** The API's page-size ceiling. */
export const MAX_PAGE_SIZE = 500;

/** Enough rows for a picker or a name lookup in one request (the API's page-size ceiling). */
export const ALL_ROWS = { page: 1, pageSize: MAX_PAGE_SIZE } as const;
export const ALL_BY_NAME = { ...ALL_ROWS, sort: 'name' } as const;

/** `?a=1&b=2` from params in their given order, leaving out blanks; '' when nothing is left. */
export function toQueryString(params?: ListParams): string {
  if (!params) return '';
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (value !== undefined && value !== '') search.set(key, String(value));
  }
  const text = search.toString();
  return text ? `?${text}` : '';
}

export function positiveInt(text: string | null, fallback: number, max = Number.MAX_SAFE_INTEGER): number {
  const value = Number(text);
  return Number.isInteger(value) && value >= 1 ? Math.min(value, max) : fallback;
}

/** What a list page asks the API for: page, size, sort, search and its filters, as named in the page's address. */
export function listApiParams(searchParams: URLSearchParams, filterKeys: readonly string[], defaultSort?: string): ListParams {
  const q = searchParams.get('q') ?? '';
  return {
    page: positiveInt(searchParams.get('page'), 1),
    pageSize: positiveInt(searchParams.get('pageSize'), DEFAULT_PAGE_SIZE, MAX_PAGE_SIZE),
    sort: searchParams.get('sort') ?? defaultSort,
    q: q.trim() || undefined,
    ...Object.fromEntries(filterKeys.map((key) => [key, searchParams.get(key) || undefined])),
  };
}
