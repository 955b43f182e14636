import { describe, expect, it } from 'vitest';
import { WINDOWS_S, allowedDowntimeS, availabilityPct, downSeconds, observedBetween, observedInWindow, roundPct } from '../../../shared/health/availability';

const now = new Date('2026-06-30T00:00:00Z');
const minsAgo = (m: number) => new Date(now.getTime() - m * 60_000);
const longAgo = new Date('2026-01-01T00:00:00Z');

describe('allowed downtime (Google SRE book, appendix "Availability Table")', () => {
  it('99.9 % over 30 days allows 43.2 minutes', () => expect(allowedDowntimeS(99.9, WINDOWS_S.d30) / 60).toBeCloseTo(43.2, 6));
  it('99 % over 30 days allows 7.2 hours', () => expect(allowedDowntimeS(99, WINDOWS_S.d30) / 3600).toBeCloseTo(7.2, 6));
  it('99.99 % over a year allows 52.6 minutes', () => expect(allowedDowntimeS(99.99, 365 * 86_400) / 60).toBeCloseTo(52.56, 2));
});

describe('availability from outages (time up ÷ time observed, REFERENCES.md)', () => {
  it('gives 99.9 % for 43.2 minutes down in 30 days (same table, read backwards)', () => {
    const start = minsAgo(1000);
    const t = observedInWindow([{ start, end: new Date(start.getTime() + 43.2 * 60_000) }], WINDOWS_S.d30, now, longAgo);
    expect(t).toEqual({ observedS: 30 * 86_400, downS: 2592 });
    expect(availabilityPct(t)).toBe(99.9);
  });

  it('gives 99 % for 7.2 hours down in 30 days (same table)', () => {
    const t = observedInWindow([{ start: minsAgo(600), end: minsAgo(600 - 432) }], WINDOWS_S.d30, now, longAgo);
    expect(availabilityPct(t)).toBe(99);
  });

  it('counts an open outage up to now and clips outages to the window', () => {
    expect(downSeconds([{ start: minsAgo(10), end: null }], minsAgo(60), now)).toBe(600);
    expect(downSeconds([{ start: minsAgo(120), end: minsAgo(30) }], minsAgo(60), now)).toBe(1800);
  });

  it('merges overlapping outages instead of counting twice', () => {
    expect(
      downSeconds(
        [
          { start: minsAgo(50), end: minsAgo(20) },
          { start: minsAgo(40), end: minsAgo(10) },
        ],
        minsAgo(60),
        now,
      ),
    ).toBe(2400);
  });

  it('measures only from when the node was first seen, and is null when nothing was observed', () => {
    // Seen 60 min ago, down 15 of them: 45 / 60 = 75 %.
    expect(availabilityPct(observedInWindow([{ start: minsAgo(30), end: minsAgo(15) }], WINDOWS_S.d30, now, minsAgo(60)))).toBe(75);
    expect(availabilityPct(observedInWindow([], WINDOWS_S.h24, now, null))).toBeNull();
    expect(availabilityPct([])).toBeNull();
  });
});

describe('pooled over nodes: node-seconds up ÷ node-seconds observed', () => {
  const from = new Date('2026-03-01T00:00:00Z');
  const to = new Date('2026-03-31T00:00:00Z'); // 30 days
  it('weighs each node by the time it was observed, and counts nothing before first seen', () => {
    const always = observedBetween([], from, to, longAgo);
    const late = observedBetween([{ start: new Date('2026-03-30T00:00:00Z'), end: null }], from, to, new Date('2026-03-29T00:00:00Z'));
    expect(late).toEqual({ observedS: 2 * 86_400, downS: 86_400 });
    // Worked: 32 node-days observed, 1 down → 31 / 32 = 96.875 % → 96.88 (half up to 0.01 %).
    expect(availabilityPct([always, late])).toBe(96.88);
    // The same two nodes averaged plainly would give (100 + 50) / 2 = 75 %: pooling is not averaging.
    expect(availabilityPct([always, late])).not.toBe(75);
    expect(availabilityPct([observedBetween([], from, to, null)])).toBeNull();
  });
});

describe('the one rounding rule (to 0.01 %, half up, never a false 100 or 0)', () => {
  it('rounds to two decimals', () => {
    expect(roundPct(12.3456)).toBe(12.35);
    expect(roundPct(12.3449)).toBe(12.34);
    expect(roundPct(100)).toBe(100);
    expect(roundPct(0)).toBe(0);
  });

  it('shows one second down in 30 days as 99.99, not 100', () => {
    // 1 − 1 / 2,592,000 = 99.99996 % exactly; plain rounding would say 100.
    expect(availabilityPct({ observedS: 2_592_000, downS: 1 })).toBe(99.99);
    expect(availabilityPct({ observedS: 2_592_000, downS: 0 })).toBe(100);
  });

  it('shows one second up in 30 days as 0.01, not 0', () => {
    expect(availabilityPct({ observedS: 2_592_000, downS: 2_591_999 })).toBe(0.01);
    expect(availabilityPct({ observedS: 2_592_000, downS: 2_592_000 })).toBe(0);
  });
});
