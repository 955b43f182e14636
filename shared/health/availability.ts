// Availability = time up ÷ time observed over a stated window (REFERENCES.md, Availability).
// The one implementation behind every page and API that shows it: node page, neighbourhood and
// host portal, public status, monthly report and its exports.

export interface Interval {
  start: Date;
  end: Date | null;
}

export const WINDOWS_S = { h24: 86_400, d7: 7 * 86_400, d30: 30 * 86_400, d90: 90 * 86_400 } as const;
export type WindowName = keyof typeof WINDOWS_S;

/** Seconds observed and seconds down for one node (or summed over several). */
export interface ObservedTime {
  observedS: number;
  downS: number;
}

/** Seconds of `intervals` (open ones run to `to`) inside [from, to], overlaps merged. */
export function downSeconds(intervals: Interval[], from: Date, to: Date): number {
  const clipped = intervals
    .map((i) => [Math.max(i.start.getTime(), from.getTime()), Math.min((i.end ?? to).getTime(), to.getTime())] as const)
    .filter(([s, e]) => e > s)
    .sort((a, b) => a[0] - b[0]);
  let total = 0;
  let curStart = -Infinity;
  let curEnd = -Infinity;
  for (const [s, e] of clipped) {
    if (s > curEnd) {
      if (curEnd > curStart) total += curEnd - curStart;
      curStart = s;
      curEnd = e;
    } else curEnd = Math.max(curEnd, e);
  }
  if (curEnd > curStart) total += curEnd - curStart;
  return total / 1000;
}

/**
 * Seconds observed and seconds down inside [from, to), counting only from when the node was first
 * seen (a node added yesterday is not "down" for the month before; never heard from → nothing observed).
 */
export function observedBetween(intervals: Interval[], from: Date, to: Date, firstSeenAt: Date | null): ObservedTime {
  if (!firstSeenAt) return { observedS: 0, downS: 0 };
  const start = new Date(Math.max(from.getTime(), firstSeenAt.getTime()));
  if (to.getTime() <= start.getTime()) return { observedS: 0, downS: 0 };
  return { observedS: (to.getTime() - start.getTime()) / 1000, downS: downSeconds(intervals, start, to) };
}

/** The window of `windowS` seconds ending at `now`, observed from first sight. */
export const observedInWindow = (intervals: Interval[], windowS: number, now: Date, firstSeenAt: Date | null): ObservedTime =>
  observedBetween(intervals, new Date(now.getTime() - windowS * 1000), now, firstSeenAt);

/**
 * The one rounding rule for a shown percentage: to 0.01 %, half up; but a figure with any downtime
 * never shows as 100 (at most 99.99) and one with any time up never shows as 0 (at least 0.01), so a
 * reader never sees "100 %" for a node that was down. Our choice, no source.
 */
export function roundPct(exactPct: number): number {
  const rounded = Math.round(exactPct * 100) / 100;
  if (rounded >= 100 && exactPct < 100) return 99.99;
  if (rounded <= 0 && exactPct > 0) return 0.01;
  return rounded;
}

/**
 * Percent of the observed time that was up, pooled over nodes when given several: node-seconds up ÷
 * node-seconds observed, so a node watched for a week weighs less than one watched for the whole
 * window (our choice; stated on the report page). Rounded by `roundPct`; null when nothing was observed.
 */
export function availabilityPct(parts: ObservedTime | ObservedTime[]): number | null {
  const list = Array.isArray(parts) ? parts : [parts];
  const observedS = list.reduce((s, p) => s + p.observedS, 0);
  const downS = list.reduce((s, p) => s + p.downS, 0);
  if (observedS <= 0) return null;
  return roundPct(Math.max(0, Math.min(100, (100 * (observedS - downS)) / observedS)));
}

/** Downtime a target allows over a window, in seconds (the SRE availability table). */
export const allowedDowntimeS = (targetPct: number, windowS: number) => ((100 - targetPct) / 100) * windowS;
