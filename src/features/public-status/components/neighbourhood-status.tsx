import { useId } from 'react';
import type { PublicNeighbourhoodStatus } from '../../../../shared/schemas/publicStatus';
import { StateShape } from '../../../components/state-badge';
import { formatPercent } from '../../../lib/format';

/** Colour, shape and word together: all up, some down, or not heard from yet. */
function overall(s: PublicNeighbourhoodStatus) {
  if (s.counts.down > 0) return { state: 'offline' as const, word: 'Some nodes down' };
  if (s.counts.up === 0) return { state: 'unknown' as const, word: 'Not heard from yet' };
  return { state: 'online' as const, word: 'Working' };
}

export function NeighbourhoodStatus({ status }: { status: PublicNeighbourhoodStatus }) {
  const look = overall(status);
  // An id from useId, never from the name: "Old Quay" has a space, and aria-labelledby reads ids split at spaces.
  const headingId = useId();
  return (
    <article className="rounded-lg border border-line bg-surface p-4" aria-labelledby={headingId} data-testid="public-neighbourhood">
      <div className="flex items-start justify-between gap-3">
        <h2 id={headingId} className="text-lg font-semibold">
          {status.name}
        </h2>
        <span className="inline-flex shrink-0 items-center gap-1.5 text-sm text-muted">
          <StateShape state={look.state} />
          {look.word}
        </span>
      </div>
      <p className="mt-1 text-xl font-medium">{status.sentence}</p>
      <dl className="mt-3 grid grid-cols-2 gap-2 text-sm">
        <div className="rounded-md bg-sunken px-3 py-2">
          <dt className="text-muted">Up in the last 24 hours</dt>
          <dd className="text-base font-semibold tabular-nums">{formatPercent(status.availability.h24Pct)}</dd>
        </div>
        <div className="rounded-md bg-sunken px-3 py-2">
          <dt className="text-muted">Up in the last 30 days</dt>
          <dd className="text-base font-semibold tabular-nums">{formatPercent(status.availability.d30Pct)}</dd>
        </div>
      </dl>
      {status.openOutages.length > 0 && (
        <ul className="mt-3 space-y-1.5 text-sm" aria-label={`Open outages in ${status.name}`}>
          {status.openOutages.map((o) => (
            <li key={o.since + o.sentence} className="flex gap-2">
              <span className="mt-0.5 shrink-0">
                <StateShape state={o.state} size={12} />
              </span>
              <span>{o.sentence}</span>
            </li>
          ))}
        </ul>
      )}
    </article>
  );
}
