import { describe, expect, it } from 'vitest';
import { WINDOWS_S, allowedDowntimeS, availabilityPct, downSeconds } from '../../../shared/health/availability';

const now = new Date('2026-06-30T00:00:00Z');
const minsAgo = (m: number) => new Date(now.getTime() - m * 60_000);

describe('allowed downtime (Google SRE book, appendix "Availability Table")', () => {
  it('99.9 % over 30 days allows 43.2 minutes', () => expect(allowedDowntimeS(99.9, WINDOWS_S.d30) / 60).toBeCloseTo(43.2, 6));
  it('99 % over 30 days allows 7.2 hours', () => expect(allowedDowntimeS(99, WINDOWS_S.d30) / 3600).toBeCloseTo(7.2, 6));
  it('99.99 % over a year allows 52.6 minutes', () => expect(allowedDowntimeS(99.99, 365 * 86_400) / 60).toBeCloseTo(52.56, 2));
});

describe('availability from outages', () => {
  it('gives 99.9 % for 43.2 minutes down in 30 days (same table, read backwards)', () => {
    const start = minsAgo(1000);
    const pct = availabilityPct([{ start, end: new Date(start.getTime() + 43.2 * 60_000) }], WINDOWS_S.d30, now, new Date('2026-01-01T00:00:00Z'));
    expect(pct).toBeCloseTo(99.9, 6);
  });

  it('counts an open outage up to now and clips outages to the window', () => {
    expect(downSeconds([{ start: minsAgo(10), end: null }], minsAgo(60), now)).toBe(600);
    expect(downSeconds([{ start: minsAgo(120), end: minsAgo(30) }], minsAgo(60), now)).toBe(1800);
  });

  it('merges overlapping outages instead of counting twice', () => {
    expect(downSeconds([{ start: minsAgo(50), end: minsAgo(20) }, { start: minsAgo(40), end: minsAgo(10) }], minsAgo(60), now)).toBe(2400);
  });

  it('measures only from when the node was first seen, and is null before that', () => {
    expect(availabilityPct([{ start: minsAgo(30), end: minsAgo(15) }], WINDOWS_S.d30, now, minsAgo(60))).toBeCloseTo(75, 6);
    expect(availabilityPct([], WINDOWS_S.h24, now, null)).toBeNull();
  });
});
