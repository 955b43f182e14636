import { downSeconds, type Interval } from './availability';

// Availability = time up ÷ time observed, over a stated window (REFERENCES.md, Availability).

export interface ObservedTime {
  observedS: number;
  downS: number;
}

/**
 * Seconds observed and seconds down inside [from, to), counting only from when the node was first
 * seen (never heard from → nothing observed). Outages still open at `to` run to `to`.
 */
export function observedBetween(intervals: Interval[], from: Date, to: Date, firstSeenAt: Date | null): ObservedTime {
  if (!firstSeenAt) return { observedS: 0, downS: 0 };
  const start = new Date(Math.max(from.getTime(), firstSeenAt.getTime()));
  if (to.getTime() <= start.getTime()) return { observedS: 0, downS: 0 };
  return { observedS: (to.getTime() - start.getTime()) / 1000, downS: downSeconds(intervals, start, to) };
}

export const pctOf = ({ observedS, downS }: ObservedTime): number | null =>
  observedS > 0 ? Math.max(0, Math.min(100, (100 * (observedS - downS)) / observedS)) : null;

/**
 * A group's availability pooled over its nodes: node-seconds up ÷ node-seconds observed, so a node
 * watched for a week weighs less than one watched for the whole window (our choice; stated on the page).
 */
export function pooledPct(parts: ObservedTime[]): number | null {
  const total = parts.reduce((acc, p) => ({ observedS: acc.observedS + p.observedS, downS: acc.downS + p.downS }), { observedS: 0, downS: 0 });
  return pctOf(total);
}
