import { describe, expect, it } from 'vitest';
import { localClock, monthOf, monthRange, zoneOffsetMin, zonedToUtc } from '../../../shared/time/monthRange';

const hours = (r: { start: Date; end: Date }) => (r.end.getTime() - r.start.getTime()) / 3_600_000;

describe('monthRange', () => {
  // Worked example. EU Directive 2000/84/EC, art. 2 and 3: summer time runs from 01:00 UTC on the
  // last Sunday of March to 01:00 UTC on the last Sunday of October. In 2026 those are 29 March and
  // 25 October. Lisbon keeps WET (UTC+0) in winter and WEST (UTC+1) in summer, so
  //   March 2026   = [00:00 WET 1 Mar, 00:00 WEST 1 Apr) = [2026-03-01T00:00Z, 2026-03-31T23:00Z) = 743 h
  //   October 2026 = [00:00 WEST 1 Oct, 00:00 WET 1 Nov) = [2026-09-30T23:00Z, 2026-11-01T00:00Z) = 745 h
  it('gives Lisbon’s March 2026 one hour short, starting and ending at local midnight', () => {
    const r = monthRange('2026-03', 'Europe/Lisbon');
    expect(r.start.toISOString()).toBe('2026-03-01T00:00:00.000Z');
    expect(r.end.toISOString()).toBe('2026-03-31T23:00:00.000Z');
    expect(hours(r)).toBe(31 * 24 - 1);
  });

  it('gives Lisbon’s October 2026 one hour long', () => {
    const r = monthRange('2026-10', 'Europe/Lisbon');
    expect(r.start.toISOString()).toBe('2026-09-30T23:00:00.000Z');
    expect(r.end.toISOString()).toBe('2026-11-01T00:00:00.000Z');
    expect(hours(r)).toBe(31 * 24 + 1);
  });

  it('gives a month without a change its plain length, and rolls December into January', () => {
    expect(hours(monthRange('2026-11', 'Europe/Lisbon'))).toBe(30 * 24);
    const dec = monthRange('2026-12', 'UTC');
    expect([dec.start.toISOString(), dec.end.toISOString()]).toEqual(['2026-12-01T00:00:00.000Z', '2027-01-01T00:00:00.000Z']);
    // Atlantic/Azores is UTC-1 in winter (from memory; the platform's tz database agrees below).
    expect(monthRange('2026-02', 'Atlantic/Azores').start.toISOString()).toBe('2026-02-01T01:00:00.000Z');
  });

  it('refuses a malformed month', () => {
    expect(() => monthRange('2026-13', 'UTC')).toThrow(/2026-11/);
    expect(() => monthRange('26-03', 'UTC')).toThrow(RangeError);
  });
});

describe('zone helpers', () => {
  it('reads the offset on each side of Lisbon’s change at 01:00 UTC on 29 March 2026 (Directive 2000/84/EC)', () => {
    expect(zoneOffsetMin(new Date('2026-03-29T00:59:00Z'), 'Europe/Lisbon')).toBe(0);
    expect(zoneOffsetMin(new Date('2026-03-29T01:00:00Z'), 'Europe/Lisbon')).toBe(60);
  });

  it('resolves a local time the change skips forward, and a local midnight after it', () => {
    // 01:00 on 29 March does not exist in Lisbon (clocks jump from 01:00 to 02:00); it lands at 02:00 WEST = 01:00 UTC.
    expect(zonedToUtc(2026, 3, 29, 'Europe/Lisbon', 1).toISOString()).toBe('2026-03-29T01:00:00.000Z');
    expect(zonedToUtc(2026, 3, 30, 'Europe/Lisbon').toISOString()).toBe('2026-03-29T23:00:00.000Z');
  });

  it('names the local month and clock of an instant', () => {
    expect(monthOf(new Date('2026-03-31T23:30:00Z'), 'Europe/Lisbon')).toBe('2026-04');
    expect(monthOf(new Date('2026-03-31T22:30:00Z'), 'Europe/Lisbon')).toBe('2026-03');
    const now = new Date('2026-06-01T15:00:00Z');
    expect(localClock(new Date('2026-06-01T14:20:00Z'), 'Europe/Lisbon', now)).toBe('15:20');
    expect(localClock(new Date('2026-05-31T20:05:00Z'), 'Europe/Lisbon', now)).toBe('31 May, 21:05');
  });

  it('takes years below 100 as written, not as 1900–1999 (ECMA-262 Date.UTC maps 0–99 to 1900+)', () => {
    expect(zonedToUtc(99, 12, 1, 'UTC').getUTCFullYear()).toBe(99);
    expect(monthRange('0099-01', 'Europe/Lisbon').start.getUTCFullYear()).toBe(99);
    expect(monthRange('1000-02', 'UTC').end.toISOString()).toBe('1000-03-01T00:00:00.000Z');
    expect(zonedToUtc(2026, 11, 1, 'UTC').toISOString()).toBe('2026-11-01T00:00:00.000Z');
  });
});
