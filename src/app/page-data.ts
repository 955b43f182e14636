import { ALL_BY_NAME, listApiParams, toQueryString } from '../lib/list-query';
import { paths } from '../lib/paths';
import type { ListParams } from '../lib/query-keys';

/**
 * The first questions each console page asks the API, in one table that the pages and the server both read. The server
 * names these URLs in the page's HTML (`<link rel="preload" as="fetch">`, server/pagePreloads.ts) when the request
 * carries a session cookie, so the answers start with the HTML instead of after every script has run; the page's own
 * fetch (same URL, same credentials mode) then takes the preloaded answer. A page here must ask exactly these URLs
 * first: tests/e2e/first-load.test.ts fails when a preloaded answer goes unused or is asked for twice.
 */
export interface DataRequest {
  /** Under /api/v1. */
  path: string;
  params?: ListParams;
}

/** A list page's address parameters: its filters and its default sort (`useListParams` reads the same). */
export interface ListSpec {
  filters: readonly string[];
  sort: string;
}

export const outageList: ListSpec = { filters: ['status', 'neighbourhoodId', 'nodeId'], sort: '-startedAt' };
export const nodeList: ListSpec = { filters: ['state', 'neighbourhoodId', 'siteId'], sort: 'name' };
export const siteList: ListSpec = { filters: ['neighbourhoodId', 'hostUserId'], sort: 'name' };
export const neighbourhoodList: ListSpec = { filters: ['retired'], sort: 'name' };
export const peopleList: ListSpec = { filters: ['role'], sort: 'name' };

const list = (search: URLSearchParams, spec: ListSpec) => listApiParams(search, spec.filters, spec.sort);

/** The neighbourhoods page lists retired ones too unless its address says otherwise. */
export function neighbourhoodListParams(params: ListParams): ListParams {
  return { ...params, retired: params.retired ?? 'all' };
}

const byName = { path: '/neighbourhoods', params: ALL_BY_NAME };

/** The month the reports page shows: its address's `month`, else the last whole month (a monthly report is read for a finished one). */
export function reportMonth(search: URLSearchParams, today = new Date()): string {
  const asked = search.get('month') ?? '';
  if (/^\d{4}-\d{2}$/.test(asked)) return asked;
  return new Date(Date.UTC(today.getUTCFullYear(), today.getUTCMonth() - 1, 1)).toISOString().slice(0, 7);
}

/** Page pattern (as in src/app/pages.ts) → its first requests, from the page's address query. */
export const pageData: Record<string, (search: URLSearchParams) => DataRequest[]> = {
  [paths.overview.pattern]: () => [{ path: '/overview' }],
  [paths.topology.pattern]: () => [{ path: '/topology' }, { path: '/topology/neighbourhoods' }, byName],
  [paths.outages.pattern]: (search) => [{ path: '/outages', params: list(search, outageList) }, byName],
  [paths.nodes.pattern]: (search) => [{ path: '/nodes', params: list(search, nodeList) }, { path: '/sites', params: ALL_BY_NAME }, byName],
  [paths.sites.pattern]: (search) => [{ path: '/sites', params: list(search, siteList) }, byName],
  [paths.neighbourhoods.pattern]: (search) => [{ path: '/neighbourhoods', params: neighbourhoodListParams(list(search, neighbourhoodList)) }],
  [paths.reports.pattern]: (search) => [{ path: '/reports/availability', params: { month: reportMonth(search) } }],
  [paths.people.pattern]: (search) => [{ path: '/users', params: list(search, peopleList) }],
  [paths.account.pattern]: () => [{ path: '/me' }],
  [paths.myNodes.pattern]: () => [{ path: '/me/nodes' }],
};

/** The URL a request is fetched at: `api.get(path, params)` builds the same. */
export const dataUrl = (request: DataRequest) => `/api/v1${request.path}${toQueryString(request.params)}`;
