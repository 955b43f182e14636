import { NODE_STATES } from '../../../../shared/enums';
import { StateShape, stateWord } from '../../../components/state-badge';
import { DISCOVERED_COLOUR, DISCOVERED_DASH, linkWidthPx, MARGIN_BANDS, MARGIN_MARK, marginColour, plannedDash } from '../utils/link-look';

function LineSwatch({ colour, widthPx, dash, mark }: { colour: string; widthPx: number; dash?: string; mark?: string | null }) {
  return (
    <svg width="36" height="16" aria-hidden="true" className="shrink-0">
      <line x1="2" y1="8" x2="34" y2="8" stroke={colour} strokeWidth={widthPx} strokeLinecap="round" strokeDasharray={dash} />
      {mark && (
        <g transform="translate(18 8)">
          <circle r="6.5" fill="var(--pp-surface)" stroke={colour} strokeWidth="1.5" />
          <text textAnchor="middle" dominantBaseline="central" fontSize="10" fontWeight="700" fill={colour}>
            {mark}
          </text>
        </g>
      )}
    </svg>
  );
}

const SAMPLE_RATES_MBPS = [6.5, 65, 300];

/** What every mark on the graph means; the fade-margin bands are Parapet's own. */
export function TopologyLegend() {
  return (
    <div data-testid="topology-legend" className="grid gap-4 rounded-lg border border-line bg-surface p-3 text-sm sm:grid-cols-2 lg:grid-cols-4">
      <div>
        <h3 className="mb-1.5 text-xs font-medium tracking-wide text-muted uppercase">Node state</h3>
        <ul className="grid grid-cols-2 gap-1">
          {NODE_STATES.map((state) => (
            <li key={state} className="flex items-center gap-1.5">
              <StateShape state={state} />
              {stateWord(state)}
            </li>
          ))}
        </ul>
        <p className="mt-1.5 flex items-center gap-1.5">
          <span aria-hidden="true" className="inline-block h-3.5 w-3.5 rounded-full border-2 border-accent" />
          Ring: uplink (carries the shared connection)
        </p>
        <p className="mt-1 flex items-center gap-1.5">
          <span aria-hidden="true" className="inline-block h-3.5 w-3.5 rounded-full border-[3px] border-double border-state-offline" />
          Double ring: an outage's root, with the nodes it cut off shown as stranded
        </p>
      </div>
      <div>
        <h3 className="mb-1.5 text-xs font-medium tracking-wide text-muted uppercase">Link colour and sign: predicted fade margin</h3>
        <ul className="space-y-1">
          {MARGIN_BANDS.map((band) => (
            <li key={band.band} className="flex items-center gap-2">
              <LineSwatch colour={marginColour(band.band)} widthPx={3} mark={MARGIN_MARK[band.band]} />
              <span>
                {band.label} <span className="text-muted">({band.range})</span>
              </span>
            </li>
          ))}
        </ul>
      </div>
      <div>
        <h3 className="mb-1.5 text-xs font-medium tracking-wide text-muted uppercase">Link width: expected rate</h3>
        <ul className="space-y-1">
          {SAMPLE_RATES_MBPS.map((rate) => (
            <li key={rate} className="flex items-center gap-2">
              <LineSwatch colour="var(--pp-muted)" widthPx={linkWidthPx(rate)} />
              {rate === 300 ? '300 Mbps or more' : `${rate} Mbps`}
            </li>
          ))}
        </ul>
      </div>
      <div>
        <h3 className="mb-1.5 text-xs font-medium tracking-wide text-muted uppercase">Link status</h3>
        <ul className="space-y-1">
          <li className="flex items-center gap-2">
            <LineSwatch colour="var(--pp-muted)" widthPx={3} /> Live
          </li>
          <li className="flex items-center gap-2">
            <LineSwatch colour="var(--pp-muted)" widthPx={3} dash={plannedDash(3)} /> Planned
          </li>
          <li className="flex items-center gap-2">
            <LineSwatch colour={DISCOVERED_COLOUR} widthPx={2.5} dash={DISCOVERED_DASH} /> Heard on the air, not in the inventory
          </li>
        </ul>
        <p className="mt-2 text-xs text-muted">Fade margin bands are Parapet's rule of thumb. Select a node to see its links' figures.</p>
      </div>
    </div>
  );
}
