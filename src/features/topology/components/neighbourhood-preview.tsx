import { memo } from 'react';
import { NODE_STATES } from '../../../../shared/enums';
import { StateShape, stateWord } from '../../../components/state-badge';
import type { TopologyNeighbourhood } from '../api/topology';
import { countsInWords, countsKey } from '../utils/neighbourhood-marks';

/**
 * While the whole graph loads: one card per neighbourhood with its node count per state, from the small
 * summary answer. Read-only; the map replaces it when the graph arrives.
 */
export const NeighbourhoodPreview = memo(function NeighbourhoodPreview({ hoods }: { hoods: TopologyNeighbourhood[] }) {
  return (
    <section aria-labelledby="topology-preview-heading" className="rounded-xl border border-line bg-surface p-3">
      <h2 id="topology-preview-heading" className="text-sm font-semibold text-ink">
        Neighbourhoods at a glance <span className="font-normal text-muted">(the map is still loading)</span>
      </h2>
      <ul className="mt-2 grid grid-cols-[repeat(auto-fill,minmax(11rem,1fr))] gap-2">
        {hoods.map((hood) => (
          <li
            key={hood.neighbourhoodId}
            data-testid={`topology-preview-hood-${hood.neighbourhoodId}`}
            data-counts={countsKey(hood.counts)}
            className="rounded-lg border-2 border-line-strong px-2 py-1 text-ink"
          >
            <span className="flex items-baseline justify-between gap-2 text-[12px] font-semibold">
              <span className="truncate">{hood.name}</span>
              <span className="shrink-0 text-[11px] font-normal text-muted tabular-nums">{hood.total} nodes</span>
            </span>
            <span className="sr-only">{countsInWords(hood.counts, stateWord)}</span>
            <span aria-hidden="true" className="mt-1 flex flex-wrap items-center gap-x-2 text-[11px] tabular-nums">
              {NODE_STATES.filter((s) => hood.counts[s] > 0).map((state) => (
                <span key={state} className="inline-flex items-center gap-0.5">
                  <StateShape state={state} size={11} />
                  {hood.counts[state]}
                </span>
              ))}
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
});
