// Every client-side address lives here: routes use `pattern`, links use `to(...)`.
export const paths = {
  signIn: {
    pattern: '/sign-in',
    to: (next?: string) => (next && next !== '/' ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in'),
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
} as const;

/** Only same-site paths may be returned to after sign-in ("//host" would leave the site). */
export function safeNextPath(next: string | null): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return paths.overview.to();
  if (next.startsWith(paths.signIn.pattern)) return paths.overview.to();
  return next;
}
