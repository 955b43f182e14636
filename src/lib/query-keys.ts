// One key factory per feature; mutations invalidate through these so nothing drifts.
export type ListParams = Record<string, string | number | undefined>;

function resourceKeys<R extends string>(resource: R) {
  return {
    all: [resource] as const,
    lists: () => [resource, 'list'] as const,
    list: (params: ListParams) => [resource, 'list', params] as const,
    details: () => [resource, 'detail'] as const,
    detail: (id: number) => [resource, 'detail', id] as const,
  };
}

export const sessionKeys = { current: () => ['session'] as const };
export const overviewKeys = { all: ['overview'] as const, summary: () => ['overview', 'summary'] as const };
export const siteKeys = resourceKeys('sites');
export const nodeKeys = resourceKeys('nodes');
export const neighbourhoodKeys = resourceKeys('neighbourhoods');
export const peopleKeys = resourceKeys('users');
export const radioKeys = resourceKeys('radios');
export const linkKeys = resourceKeys('links');
