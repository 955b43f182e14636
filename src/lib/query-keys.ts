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
export const outageKeys = resourceKeys('outages');
export const topologyKeys = { all: ['topology'] as const, graph: () => ['topology', 'graph'] as const };
// Under the node's own key, so removing or invalidating a node takes its figures with it.
export const nodeTelemetryKeys = {
  all: (id: number) => ['nodes', 'telemetry', id] as const,
  series: (id: number, range: string) => ['nodes', 'telemetry', id, 'series', range] as const,
  availability: (id: number) => ['nodes', 'telemetry', id, 'availability'] as const,
};
export const accountKeys = { me: () => ['me'] as const, myNodes: () => ['me', 'nodes'] as const };
export const historyKeys = { all: ['history'] as const, list: (params: ListParams) => ['history', params] as const };
export const neighbourhoodSummaryKeys = { one: (id: number) => ['neighbourhoods', 'summary', id] as const };
