import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient, type QueryKey } from '@tanstack/react-query';
import type { ListEnvelope } from '../../shared/schemas/common';
import { api } from './api';
import type { ListParams } from './query-keys';

/** A list answer: rows, the page, and whether the caller may add to it. */
export interface ListResponse<T> extends ListEnvelope<T> {
  abilities?: { create: boolean };
}

interface ResourceKeys {
  all: readonly unknown[];
  list: (params: ListParams) => QueryKey;
  detail: (id: number) => QueryKey;
}

/**
 * The one query behind a resource's list key: the key always holds the whole list envelope
 * (rows, pagination, abilities). Readers that want only the rows narrow it with `select`, never
 * by storing a different shape under the same key.
 */
export function listQuery<Dto>(path: string, keys: Pick<ResourceKeys, 'list'>, params: ListParams) {
  return queryOptions({ queryKey: keys.list(params), queryFn: () => api.get<ListResponse<Dto>>(path, params) });
}

/** The rows of a list envelope, for `select`. */
export const rowsOf = <Dto>(body: ListResponse<Dto>): Dto[] => body.data;

/**
 * The read and write hooks every inventory resource shares. `related` are the keys whose
 * figures a change here also moves (counts on the overview, a neighbourhood's node count).
 */
export function resourceHooks<Dto, Create, Update>(path: string, keys: ResourceKeys, related: readonly (readonly unknown[])[]) {
  function useInvalidate() {
    const queryClient = useQueryClient();
    return () => Promise.all([keys.all, ...related].map((queryKey) => queryClient.invalidateQueries({ queryKey: [...queryKey] })));
  }

  return {
    useList(params: ListParams, options: { enabled?: boolean } = {}) {
      return useQuery({
        ...listQuery<Dto>(path, keys, params),
        placeholderData: keepPreviousData,
        enabled: options.enabled ?? true,
      });
    },
    useOne(id: number) {
      return useQuery({
        queryKey: keys.detail(id),
        queryFn: () => api.get<{ data: Dto }>(`${path}/${id}`).then((body) => body.data),
        enabled: Number.isInteger(id) && id > 0,
      });
    },
    useCreate() {
      const invalidate = useInvalidate();
      return useMutation({
        mutationFn: (input: Create) => api.post<{ data: Dto }>(path, input).then((body) => body.data),
        onSuccess: invalidate,
      });
    },
    useUpdate(id: number) {
      const invalidate = useInvalidate();
      return useMutation({
        mutationFn: (input: Update) => api.patch<{ data: Dto }>(`${path}/${id}`, input).then((body) => body.data),
        onSuccess: invalidate,
      });
    },
    useRemove(id: number) {
      const queryClient = useQueryClient();
      const invalidate = useInvalidate();
      return useMutation({
        mutationFn: () => api.delete(`${path}/${id}`),
        onSuccess: async () => {
          // The record is gone: drop its detail rather than refetch it into a 404.
          queryClient.removeQueries({ queryKey: keys.detail(id) });
          await invalidate();
        },
      });
    },
  };
}

/** id → name, for showing a related record's name in a table without a request per row. */
export function nameLookup<T extends { id: number; name: string | null }>(rows: T[] | undefined): Map<number, string> {
  return new Map((rows ?? []).map((row) => [row.id, row.name ?? `#${row.id}`]));
}

export function toOptions<T extends { id: number; name: string | null }>(rows: T[] | undefined): { value: string; label: string }[] {
  return (rows ?? []).map((row) => ({ value: String(row.id), label: row.name ?? `#${row.id}` }));
}

export { ALL_ROWS, ALL_BY_NAME } from './list-query';

/** A positive whole-number id from a route parameter, or null when the address is malformed. */
export function idFromParam(text: string | undefined): number | null {
  const id = Number(text);
  return Number.isInteger(id) && id > 0 ? id : null;
}
