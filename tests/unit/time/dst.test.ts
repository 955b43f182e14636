import { describe, expect, it } from 'vitest';
import { quietUntil } from '../../../server/mail/quietHours';
import { localClock, monthOf, monthRange, wallTimeToUtc, zoneOffsetMin } from '../../../shared/time/monthRange';

// The change dates below come from the IANA tz database (files `europe` and `northamerica`):
// - EU rule (Europe/Berlin): summer time from 01:00 UTC on the last Sunday of March to 01:00 UTC on
//   the last Sunday of October (also Directive 2000/84/EC art. 2–3) — in 2026, 29 March and 25 October.
//   CET = UTC+1, CEST = UTC+2.
// - US rule (America/New_York): from 02:00 local on the second Sunday of March to 02:00 local on the
//   first Sunday of November (also US Energy Policy Act of 2005 §110) — in 2026, 8 March and 1 November.
//   EST = UTC−5, EDT = UTC−4.
const hours = (r: { start: Date; end: Date }) => (r.end.getTime() - r.start.getTime()) / 3_600_000;
const iso = (d: Date) => d.toISOString();

describe('calendar months across a clock change (IANA tz database)', () => {
  it('Berlin: March 2026 is 743 h from local midnight to local midnight, October 745 h', () => {
    const march = monthRange('2026-03', 'Europe/Berlin');
    expect([iso(march.start), iso(march.end)]).toEqual(['2026-02-28T23:00:00.000Z', '2026-03-31T22:00:00.000Z']);
    expect(hours(march)).toBe(31 * 24 - 1);
    const october = monthRange('2026-10', 'Europe/Berlin');
    expect([iso(october.start), iso(october.end)]).toEqual(['2026-09-30T22:00:00.000Z', '2026-10-31T23:00:00.000Z']);
    expect(hours(october)).toBe(31 * 24 + 1);
  });

  it('New York: March 2026 is 743 h, November 2026 is 721 h', () => {
    const march = monthRange('2026-03', 'America/New_York');
    expect([iso(march.start), iso(march.end)]).toEqual(['2026-03-01T05:00:00.000Z', '2026-04-01T04:00:00.000Z']);
    expect(hours(march)).toBe(31 * 24 - 1);
    const november = monthRange('2026-11', 'America/New_York');
    expect([iso(november.start), iso(november.end)]).toEqual(['2026-11-01T04:00:00.000Z', '2026-12-01T05:00:00.000Z']);
    expect(hours(november)).toBe(30 * 24 + 1);
  });

  it('reads the offset on each side of each change', () => {
    expect(zoneOffsetMin(new Date('2026-03-29T00:59:00Z'), 'Europe/Berlin')).toBe(60);
    expect(zoneOffsetMin(new Date('2026-03-29T01:00:00Z'), 'Europe/Berlin')).toBe(120);
    expect(zoneOffsetMin(new Date('2026-10-25T00:59:00Z'), 'Europe/Berlin')).toBe(120);
    expect(zoneOffsetMin(new Date('2026-10-25T01:00:00Z'), 'Europe/Berlin')).toBe(60);
    expect(zoneOffsetMin(new Date('2026-03-08T06:59:00Z'), 'America/New_York')).toBe(-300);
    expect(zoneOffsetMin(new Date('2026-03-08T07:00:00Z'), 'America/New_York')).toBe(-240);
    expect(zoneOffsetMin(new Date('2026-11-01T05:59:00Z'), 'America/New_York')).toBe(-240);
    expect(zoneOffsetMin(new Date('2026-11-01T06:00:00Z'), 'America/New_York')).toBe(-300);
  });

  it('names the local month and clock right after a change', () => {
    expect(monthOf(new Date('2026-10-31T22:30:00Z'), 'Europe/Berlin')).toBe('2026-10'); // 23:30 CET
    expect(monthOf(new Date('2026-10-31T23:30:00Z'), 'Europe/Berlin')).toBe('2026-11');
    expect(localClock(new Date('2026-03-29T01:30:00Z'), 'Europe/Berlin', new Date('2026-03-29T10:00:00Z'))).toBe('03:30');
    expect(localClock(new Date('2026-11-01T06:30:00Z'), 'America/New_York', new Date('2026-11-01T12:00:00Z'))).toBe('01:30');
  });
});

describe('wall-clock times a change skips or repeats (RFC 5545 §3.3.5, from memory)', () => {
  it('reads a skipped time with the offset before the gap (it lands after the gap)', () => {
    expect(iso(wallTimeToUtc('2026-03-29T02:30:00', 'Europe/Berlin'))).toBe('2026-03-29T01:30:00.000Z'); // 03:30 CEST
    expect(iso(wallTimeToUtc('2026-03-08T02:30:00', 'America/New_York'))).toBe('2026-03-08T07:30:00.000Z'); // 03:30 EDT
  });

  it('takes the first of a repeated time', () => {
    expect(iso(wallTimeToUtc('2026-10-25T02:30:00', 'Europe/Berlin'))).toBe('2026-10-25T00:30:00.000Z'); // 02:30 CEST
    expect(iso(wallTimeToUtc('2026-11-01T01:30:00', 'America/New_York'))).toBe('2026-11-01T05:30:00.000Z'); // 01:30 EDT
  });

  it('refuses an unknown zone and a malformed time with a message', () => {
    expect(() => wallTimeToUtc('2026-03-29T02:30:00', 'Nowhere/Atall')).toThrow(/unknown time zone/);
    expect(() => wallTimeToUtc('29 March', 'UTC')).toThrow(/2026-03-29T02:30:00/);
  });
});

describe('quiet hours 22:00–07:00 across a clock change end at 07:00 local', () => {
  it('Berlin, spring forward: from 23:00 CET on 28 March to 07:00 CEST (05:00 UTC), not 08:00 CEST', () => {
    expect(iso(quietUntil(new Date('2026-03-28T22:00:00Z'), 'Europe/Berlin', '22:00', '07:00'))).toBe('2026-03-29T05:00:00.000Z');
  });

  it('Berlin, fall back: from 23:00 CEST on 24 October to 07:00 CET (06:00 UTC), not 06:00 CET', () => {
    expect(iso(quietUntil(new Date('2026-10-24T21:00:00Z'), 'Europe/Berlin', '22:00', '07:00'))).toBe('2026-10-25T06:00:00.000Z');
  });

  it('New York, both changes: 07:00 EDT on 8 March (11:00 UTC) and 07:00 EST on 1 November (12:00 UTC)', () => {
    expect(iso(quietUntil(new Date('2026-03-08T03:00:00Z'), 'America/New_York', '22:00', '07:00'))).toBe('2026-03-08T11:00:00.000Z');
    expect(iso(quietUntil(new Date('2026-11-01T02:00:00Z'), 'America/New_York', '22:00', '07:00'))).toBe('2026-11-01T12:00:00.000Z');
  });

  it('a span ending at a skipped time ends when the clocks jump past it', () => {
    // 00:00–02:30 in Berlin on 29 March: 02:30 never shows; the mail leaves at 03:30 CEST (01:30 UTC).
    expect(iso(quietUntil(new Date('2026-03-28T23:30:00Z'), 'Europe/Berlin', '00:00', '02:30'))).toBe('2026-03-29T01:30:00.000Z');
  });

  it('an unknown zone reads as UTC', () => {
    expect(iso(quietUntil(new Date('2026-06-01T23:30:00Z'), 'Nowhere/Atall', '22:00', '07:00'))).toBe('2026-06-02T07:00:00.000Z');
  });
});
