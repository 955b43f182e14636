import type { ReactNode } from 'react';
import { formatFigure } from '../../../lib/format';
import type { TopologyLink, TopologyNode } from '../api/topology';
import { MARGIN_BANDS, marginBand, marginColour } from '../utils/link-look';

const bandLabel = new Map(MARGIN_BANDS.map((b) => [b.band, b.label]));

/** A node's links with the figures the map's colours and widths stand for. */
export function NodeLinks({
  node,
  links,
  names,
  actions,
}: {
  node: TopologyNode;
  links: TopologyLink[];
  names: Map<number, string>;
  actions?: (linkId: number) => ReactNode;
}) {
  const own = links.filter((l) => l.nodeAId === node.id || l.nodeBId === node.id);
  return (
    <section aria-label="Links of the selected node" className="rounded-lg border border-line bg-surface p-3">
      <h3 className="mb-1.5 text-xs font-medium tracking-wide text-muted uppercase">Links</h3>
      {own.length === 0 ? (
        <p className="text-sm text-muted">No links recorded for this node.</p>
      ) : (
        <ul data-testid="node-links" className="space-y-2 text-sm">
          {own.map((link) => {
            const other = link.nodeAId === node.id ? link.nodeBId : link.nodeAId;
            const band = marginBand(link.fadeMarginDb);
            return (
              <li key={link.id}>
                <p className="flex items-center gap-1.5 font-medium">
                  <span aria-hidden="true" className="inline-block h-1 w-4 shrink-0 rounded" style={{ background: marginColour(band) }} />
                  {names.get(other) ?? `#${other}`}
                  {link.status === 'planned' && <span className="rounded bg-sunken px-1 text-xs font-normal text-muted">planned</span>}
                </p>
                <p className="text-xs text-muted">
                  Fade margin {formatFigure(link.fadeMarginDb, 'dB')} ({bandLabel.get(band)?.toLowerCase()}), expected{' '}
                  {formatFigure(link.expectedRateMbps, 'Mbps')}
                  {link.distanceKm !== null && `, ${formatFigure(link.distanceKm, 'km', 2)}`}
                  {link.measuredSignalDbm !== null &&
                    `, measured ${formatFigure(link.measuredSignalDbm, 'dBm', 0)} against ${formatFigure(link.predictedSignalDbm, 'dBm', 0)} predicted`}
                </p>
                {actions && <div className="mt-1">{actions(link.id)}</div>}
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}
