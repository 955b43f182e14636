import { LoadError, Loading } from '../components/query-state';
import { ParapetMark } from '../components/layout/parapet-mark';
import { usePublicStatus } from '../features/public-status/api/public-status';
import { NeighbourhoodStatus } from '../features/public-status/components/neighbourhood-status';

/** The page anyone may open: per neighbourhood, is the network up? No sign-in, no names. */
export function PublicStatusPage() {
  const status = usePublicStatus();
  const data = status.data;
  const updated = data
    ? new Intl.DateTimeFormat('en-GB', { timeZone: data.network.timeZone, hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).format(
        new Date(data.generatedAt),
      )
    : null;
  const down = data?.neighbourhoods.reduce((n, h) => n + h.counts.down, 0) ?? 0;

  return (
    <div className="min-h-screen bg-bg">
      <title>{data ? `${data.network.name} · status` : 'Network status · Parapet'}</title>
      <header className="border-b border-line bg-surface">
        <div className="mx-auto flex max-w-3xl items-center gap-3 px-4 py-3">
          <ParapetMark />
          <div className="min-w-0">
            <h1 className="text-lg font-semibold leading-tight break-words">{data?.network.name ?? 'Network status'}</h1>
            <p className="text-sm text-muted">Is the community network up where you live?</p>
          </div>
        </div>
      </header>
      <main className="mx-auto max-w-3xl px-4 py-5" id="main">
        {status.isPending ? (
          <Loading label="Asking the network…" />
        ) : status.isError || !data ? (
          <LoadError error={status.error} />
        ) : (
          <>
            <p className="mb-4 text-base" data-testid="public-summary">
              {down === 0
                ? 'Every neighbourhood is working as far as we can tell.'
                : `${down === 1 ? 'One node is' : `${down} nodes are`} down right now. Volunteers are told automatically.`}{' '}
              <span className="text-muted">Updated at {updated}.</span>
            </p>
            {data.neighbourhoods.length === 0 ? (
              <p className="text-muted">No neighbourhoods are listed yet.</p>
            ) : (
              <div className="grid gap-3 sm:grid-cols-2">
                {data.neighbourhoods.map((h) => (
                  <NeighbourhoodStatus key={h.name} status={h} />
                ))}
              </div>
            )}
            <footer className="mt-6 space-y-1 text-xs text-muted">
              <p>Times are shown in the network’s time zone ({data.network.timeZone}).</p>
              <p>“Up” means the share of time the neighbourhood’s nodes were answering, counted from when each node was first heard from.</p>
              <p>
                Run this network?{' '}
                <a href="/sign-in" className="underline">
                  Sign in
                </a>
                .
              </p>
            </footer>
          </>
        )}
      </main>
    </div>
  );
}
