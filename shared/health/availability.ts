// Availability = time up ÷ time observed over a stated window (REFERENCES.md, Availability).

export interface Interval {
  start: Date;
  end: Date | null;
}

export const WINDOWS_S = { h24: 86_400, d7: 7 * 86_400, d30: 30 * 86_400, d90: 90 * 86_400 } as const;
export type WindowName = keyof typeof WINDOWS_S;

/** Seconds of `intervals` (open ones run to `now`) inside [from, now], overlaps merged. */
export function downSeconds(intervals: Interval[], from: Date, now: Date): number {
  const clipped = intervals
    .map((i) => [Math.max(i.start.getTime(), from.getTime()), Math.min((i.end ?? now).getTime(), now.getTime())] as const)
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
 * Percent of the window the node was up, observed from when it was first seen (a node added
 * yesterday is not "down" for the month before). Null when nothing was observed.
 */
export function availabilityPct(intervals: Interval[], windowS: number, now: Date, observedSince: Date | null): number | null {
  if (!observedSince) return null;
  const from = new Date(Math.max(now.getTime() - windowS * 1000, observedSince.getTime()));
  const observedS = (now.getTime() - from.getTime()) / 1000;
  if (observedS <= 0) return null;
  return Math.max(0, Math.min(100, (100 * (observedS - downSeconds(intervals, from, now))) / observedS));
}

/** Downtime a target allows over a window, in seconds (the SRE availability table). */
export const allowedDowntimeS = (targetPct: number, windowS: number) => ((100 - targetPct) / 100) * windowS;
