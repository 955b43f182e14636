// Every client-side address lives here: routes use `pattern`, links use `to(...)`.
export const paths = {
  signIn: {
    pattern: '/sign-in',
    to: (next?: string) => (next && next !== '/' ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in'),
  },
  forgotPassword: { pattern: '/forgot-password', to: () => '/forgot-password' },
  resetPassword: { pattern: '/reset/:token', to: (token: string) => `/reset/${encodeURIComponent(token)}` },
  acceptInvitation: { pattern: '/invite/:token', to: (token: string) => `/invite/${encodeURIComponent(token)}` },
  account: { pattern: '/account', to: () => '/account' },
  myNodes: { pattern: '/my-nodes', to: () => '/my-nodes' },
  history: {
    pattern: '/history',
    to: (filter?: { table: string; recordId: number }) => (filter ? `/history?table=${filter.table}&recordId=${filter.recordId}` : '/history'),
  },
  overview: { pattern: '/', to: () => '/' },
  sites: { pattern: '/sites', to: () => '/sites' },
  siteNew: { pattern: '/sites/new', to: () => '/sites/new' },
  siteDetail: { pattern: '/sites/:siteId', to: (id: number) => `/sites/${id}` },
  nodes: { pattern: '/nodes', to: () => '/nodes' },
  nodeDetail: { pattern: '/nodes/:nodeId', to: (id: number) => `/nodes/${id}` },
  neighbourhoods: { pattern: '/neighbourhoods', to: () => '/neighbourhoods' },
  neighbourhoodDetail: { pattern: '/neighbourhoods/:neighbourhoodId', to: (id: number) => `/neighbourhoods/${id}` },
  people: { pattern: '/people', to: () => '/people' },
  publicStatus: { pattern: '/status', to: () => '/status' },
  hostRecovery: { pattern: '/recover', to: (token: string) => `/recover?t=${encodeURIComponent(token)}` },
  outageDetail: { pattern: '/outages/:outageId', to: (id: number) => `/outages/${id}` },
  imports: { pattern: '/imports', to: (kind?: 'sites' | 'nodes') => (kind ? `/imports?kind=${kind}` : '/imports') },
  reports: { pattern: '/reports', to: (month?: string) => (month ? `/reports?month=${month}` : '/reports') },
  planning: { pattern: '/planning', to: () => '/planning' },
  linkBudget: { pattern: '/planning/link-budget', to: () => '/planning/link-budget' },
  channelPlan: { pattern: '/planning/channels', to: () => '/planning/channels' },
  addressPlan: { pattern: '/planning/addresses', to: () => '/planning/addresses' },
  securityReview: { pattern: '/planning/security', to: () => '/planning/security' },
  provisioningSheet: { pattern: '/nodes/:nodeId/provisioning', to: (id: number) => `/nodes/${id}/provisioning` },
  preferences: { pattern: '/preferences', to: () => '/preferences' },
  outbox: { pattern: '/outbox', to: () => '/outbox' },
  topology: { pattern: '/topology', to: (nodeId?: number) => (nodeId ? `/topology?node=${nodeId}` : '/topology') },
  outages: {
    pattern: '/outages',
    to: (filters: { status?: 'open' | 'closed'; nodeId?: number } = {}) => {
      const search = new URLSearchParams();
      if (filters.status) search.set('status', filters.status);
      if (filters.nodeId) search.set('nodeId', String(filters.nodeId));
      const text = search.toString();
      return text ? `/outages?${text}` : '/outages';
    },
  },
} as const;

/** Only same-site paths may be returned to after sign-in ("//host" would leave the site). */
export function safeNextPath(next: string | null): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return paths.overview.to();
  if (next.startsWith(paths.signIn.pattern)) return paths.overview.to();
  return next;
}
