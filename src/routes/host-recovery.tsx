import { useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import type { RecoveryDto } from '../../shared/schemas/recovery';
import { Button } from '../components/button';
import { ParapetMark } from '../components/layout/parapet-mark';
import { LoadError, Loading } from '../components/query-state';
import { useRecordStep, useRecovery } from '../features/host-recovery/api/recovery';
import { useNodeHeard, useSecondsSince } from '../features/host-recovery/api/use-node-heard';
import { SafetyFirst, StepCard, STEPS } from '../features/host-recovery/components/recovery-steps';

const clock = (iso: string) => new Intl.DateTimeFormat('en-GB', { hour: '2-digit', minute: '2-digit' }).format(new Date(iso));

/** Heard from the node after the outage began (live, or already when the page loaded). */
function lastHeard(page: RecoveryDto, liveAt: string | null): string | null {
  const loaded =
    page.node.lastSeenAt && page.node.lastSeenAt > page.startedAt && (page.endedAt || page.node.state === 'online' || page.node.state === 'degraded')
      ? page.node.lastSeenAt
      : null;
  if (liveAt && (!loaded || liveAt > loaded)) return liveAt;
  return loaded;
}

/** "12 s ago" while it is fresh, then minutes and hours, so a page opened later still reads plainly. */
const ago = (seconds: number) =>
  seconds < 120 ? `${seconds} s ago` : seconds < 7200 ? `${Math.round(seconds / 60)} min ago` : `${Math.round(seconds / 3600)} h ago`;

function BackBanner({ at }: { at: string }) {
  const seconds = useSecondsSince(at) ?? 0;
  return (
    <div role="status" data-testid="recovery-back" className="rounded-lg border-2 border-state-online bg-surface px-4 py-4 text-xl font-semibold">
      We heard from your node {ago(seconds)}: it is back.
      <p className="mt-2 text-base font-normal">Thank you. Nothing more is needed; you can close this page.</p>
    </div>
  );
}

/**
 * The page the host opens on their phone from the outage mail: large type, one step per screen,
 * safety first, each step told to the operators, and the node's return shown the moment it reports.
 */
export function HostRecoveryPage() {
  const [search] = useSearchParams();
  const token = search.get('t') ?? '';
  const page = useRecovery(token);
  const heard = useNodeHeard(token, page.data?.node.id);
  const record = useRecordStep(token);
  const [screen, setScreen] = useState(-1); // -1: the safety note; STEPS.length: could not fix it
  const [gaveUp, setGaveUp] = useState(false);
  const data = page.data;
  const backAt = data ? lastHeard(data, heard.at) : null;

  const tell = (input: Parameters<typeof record.mutate>[0], next: number) => record.mutate(input, { onSuccess: () => setScreen(next) });

  return (
    <div className="min-h-screen bg-bg text-lg">
      <title>{data ? `${data.node.name} · what to check` : 'What to check · Parapet'}</title>
      <header className="border-b border-line bg-surface">
        <div className="mx-auto flex max-w-xl items-center gap-3 px-4 py-3">
          <ParapetMark size={36} />
          <div className="min-w-0">
            <h1 className="text-xl font-semibold leading-tight break-words">{data ? `Your node ${data.node.name}` : 'Your node'}</h1>
            {data && <p className="text-base text-muted break-words">{data.siteName}</p>}
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto max-w-xl space-y-5 px-4 py-5">
        {!token ? (
          <p>Open this page from the link in the e-mail Parapet sent you.</p>
        ) : page.isPending ? (
          <Loading label="Asking the network about your node…" />
        ) : page.isError || !data ? (
          <LoadError error={page.error} />
        ) : (
          <>
            {backAt ? (
              <BackBanner at={backAt} />
            ) : (
              <p role="status" className="rounded-md bg-sunken px-3 py-2 text-base" data-testid="recovery-waiting">
                Your node has not answered since {clock(data.startedAt)}.{' '}
                {heard.connected ? 'This page will tell you the moment it does.' : 'Connecting, so this page can tell you the moment it does…'}
              </p>
            )}
            {!backAt && data.upstream && (
              <section className="space-y-3" data-testid="recovery-upstream">
                <h2 className="text-2xl font-semibold">Nothing to do at your place</h2>
                <p>
                  The problem is at {data.upstream.siteName}, further up the network; operators are on it. Please leave everything plugged in: your node will
                  come back by itself.
                </p>
                <p className="text-base text-muted">{data.whatNext}</p>
              </section>
            )}
            {!backAt && !data.upstream && !data.endedAt && (
              <>
                {screen === -1 && <SafetyFirst onStart={() => setScreen(0)} />}
                {screen >= 0 && screen < STEPS.length && (
                  <StepCard
                    index={screen}
                    total={STEPS.length}
                    screen={STEPS[screen]}
                    busy={record.isPending}
                    onDone={() => tell(STEPS[screen].done, screen + 1)}
                    onUnreachable={() => tell({ step: 'cannot-reach', note: STEPS[screen].unreachable }, screen + 1)}
                  />
                )}
                {screen === STEPS.length && (
                  <section className="space-y-4" data-testid="recovery-end">
                    <h2 className="text-2xl font-semibold">{gaveUp ? 'Thank you for trying' : 'Still not back?'}</h2>
                    {!gaveUp && <p>If it has been a few minutes since the last step, it will not come back by itself.</p>}
                    {!gaveUp && (
                      <Button
                        variant="primary"
                        className="w-full py-3 text-lg"
                        disabled={record.isPending}
                        onClick={() => record.mutate({ step: 'cannot-reach', note: 'Tried the steps; it is still down' }, { onSuccess: () => setGaveUp(true) })}
                      >
                        I could not fix it
                      </Button>
                    )}
                    <p data-testid="recovery-next">{data.whatNext}</p>
                  </section>
                )}
                {record.isError && <LoadError error={record.error} />}
              </>
            )}
            {data.steps.length > 0 && (
              <section aria-labelledby="told-title" className="border-t border-line pt-4">
                <h2 id="told-title" className="text-base font-semibold">
                  What you told the volunteers
                </h2>
                <ul className="mt-1 space-y-1 text-base text-muted">
                  {data.steps.map((s) => (
                    <li key={`${s.at}-${s.text}`}>
                      {clock(s.at)}: {s.text}
                    </li>
                  ))}
                </ul>
              </section>
            )}
            <p className="text-sm text-muted">
              This link works until {clock(data.linkExpiresAt)} on {new Date(data.linkExpiresAt).toLocaleDateString('en-GB')} and only for this outage.
            </p>
          </>
        )}
      </main>
    </div>
  );
}
