// Health rules for one node: thresholds, hysteresis and silence. Pure; the clock is passed in.
import type { NodeState } from '../enums';

export interface HealthThresholds {
  /** Below this received signal a radio is weak (dBm). */
  minSignalDbm: number;
  /** Below this SNR a radio is weak (dB). */
  minSnrDb: number;
  /** Below this measured throughput the node is slow (Mbps). */
  minThroughputMbps: number;
  /** A node is offline after this many expected report intervals without a report. */
  offlineAfterIntervals: number;
  /** How far past a threshold a figure must come back before the node counts as healthy again. */
  hysteresisDb: number;
  /** Consecutive reports on the other side of a threshold before the state changes. */
  consecutiveReports: number;
}

export const DEFAULT_THRESHOLDS: HealthThresholds = {
  minSignalDbm: -80,
  minSnrDb: 15,
  minThroughputMbps: 2,
  offlineAfterIntervals: 3,
  hysteresisDb: 3,
  consecutiveReports: 2,
};

export interface ReportFigures {
  signalDbm?: number | null;
  snrDb?: number | null;
  throughputMbps?: number | null;
}

/** Why figures fall short; `margin` widens each limit by the hysteresis so recovery needs clear air. */
export function weaknesses(f: ReportFigures, t: HealthThresholds, margin = 0): string[] {
  const out: string[] = [];
  if (f.signalDbm != null && f.signalDbm < t.minSignalDbm + margin) out.push(`signal ${f.signalDbm} dBm below ${t.minSignalDbm + margin} dBm`);
  if (f.snrDb != null && f.snrDb < t.minSnrDb + margin) out.push(`SNR ${f.snrDb} dB below ${t.minSnrDb + margin} dB`);
  if (f.throughputMbps != null && f.throughputMbps < t.minThroughputMbps * (margin ? 1.25 : 1))
    out.push(`throughput ${f.throughputMbps} Mbps below ${t.minThroughputMbps * (margin ? 1.25 : 1)} Mbps`);
  return out;
}

export interface HealthMemory {
  state: NodeState;
  /** Reports in a row that argued for the other of online/degraded. */
  streak: number;
}

export interface Verdict {
  state: NodeState;
  streak: number;
  reason: string;
}

/**
 * The state after a fresh report (common practice, no source: hysteresis with a dead band and a
 * consecutive-sample count, as in any alarm with a set and a clear level).
 * A node's first report moves it from unknown (or back from offline) straight to online or degraded.
 */
export function afterReport(prev: HealthMemory, f: ReportFigures, t: HealthThresholds): Verdict {
  if (prev.state === 'maintenance') return { state: 'maintenance', streak: 0, reason: 'inside a maintenance window' };
  const weakNow = weaknesses(f, t);
  if (prev.state !== 'online' && prev.state !== 'degraded') {
    return weakNow.length ? { state: 'degraded', streak: 0, reason: weakNow.join('; ') } : { state: 'online', streak: 0, reason: 'reporting' };
  }
  if (prev.state === 'online') {
    if (!weakNow.length) return { state: 'online', streak: 0, reason: 'reporting' };
    const streak = prev.streak + 1;
    return streak >= t.consecutiveReports
      ? { state: 'degraded', streak: 0, reason: weakNow.join('; ') }
      : { state: 'online', streak, reason: `weak for ${streak} report(s): ${weakNow.join('; ')}` };
  }
  // degraded: recover only when clear of every limit by the hysteresis margin, several reports in a row
  const weakWithMargin = weaknesses(f, t, t.hysteresisDb);
  if (weakWithMargin.length) return { state: 'degraded', streak: 0, reason: weakWithMargin.join('; ') };
  const streak = prev.streak + 1;
  return streak >= t.consecutiveReports
    ? { state: 'online', streak: 0, reason: 'figures recovered' }
    : { state: 'degraded', streak, reason: `recovering for ${streak} report(s)` };
}

/** When a node that last reported at `lastSeenAt` counts as silent (offline). */
export function silentSince(lastSeenAt: Date, reportIntervalS: number, t: HealthThresholds): Date {
  return new Date(lastSeenAt.getTime() + reportIntervalS * t.offlineAfterIntervals * 1000);
}

/**
 * Is the node silent at `now`? After Parapet itself was down, silence is measured from when it came
 * back (`watchingSince`), so a restart does not declare the whole network offline at once.
 */
export function isSilent(now: Date, lastSeenAt: Date | null, watchingSince: Date, reportIntervalS: number, t: HealthThresholds): boolean {
  const from = lastSeenAt && lastSeenAt > watchingSince ? lastSeenAt : watchingSince;
  return now >= silentSince(from, reportIntervalS, t);
}

/** SNR from signal and noise when both are known (REFERENCES.md: SNR = Prx − N). */
export const snrDb = (signalDbm?: number | null, noiseDbm?: number | null) => (signalDbm != null && noiseDbm != null ? signalDbm - noiseDbm : null);
