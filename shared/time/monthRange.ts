// Calendar months and wall-clock times in a named IANA time zone (the IANA tz database, through
// date-fns-tz and the platform's Intl). DST rules come from that database, never from our code.
import { formatInTimeZone, toZonedTime } from 'date-fns-tz';

const DAY_MS = 86_400_000;
const WALL = "yyyy-MM-dd'T'HH:mm:ss";

/** Whether the platform knows the zone name. */
export function isTimeZone(timeZone: string): boolean {
  try {
    formatInTimeZone(0, timeZone, 'X');
    return true;
  } catch {
    return false;
  }
}

/**
 * The zone's offset from UTC at an instant, in ms: the instant's wall clock there, read as UTC, less
 * the instant. (date-fns-tz's getTimezoneOffset reads its date as a wall time, wrong for an hour
 * after a change, so it is not used.)
 */
function offsetMs(instant: number, timeZone: string): number {
  const z = toZonedTime(instant, timeZone);
  if (Number.isNaN(z.getTime())) throw new RangeError(`unknown time zone "${timeZone}"`);
  const wall = new Date(0);
  wall.setUTCFullYear(z.getFullYear(), z.getMonth(), z.getDate());
  wall.setUTCHours(z.getHours(), z.getMinutes(), z.getSeconds(), z.getMilliseconds());
  return wall.getTime() - instant;
}

/** The zone's offset from UTC at an instant, in minutes (east positive). */
export const zoneOffsetMin = (instant: Date, timeZone: string): number => Math.round(offsetMs(instant.getTime(), timeZone) / 60_000);

const pad = (n: number, width = 2) => String(n).padStart(width, '0');

/**
 * The instant a local wall-clock time "YYYY-MM-DDTHH:mm:ss" happens in the zone. As RFC 5545
 * §3.3.5 rules for local times (from memory): a time the clocks skip is read with the offset
 * before the gap (so 02:30 on a spring-forward night is 03:30 summer time), and a time that
 * happens twice is its first occurrence.
 */
export function wallTimeToUtc(wall: string, timeZone: string): Date {
  const wallMs = /^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d$/.test(wall) ? Date.parse(`${wall}Z`) : NaN;
  if (Number.isNaN(wallMs)) throw new RangeError(`wall-clock time must look like 2026-03-29T02:30:00, not "${wall}"`);
  // Two days either side: the offsets in force before and after any one change near this time.
  const before = offsetMs(wallMs - 2 * DAY_MS, timeZone);
  const after = offsetMs(wallMs + 2 * DAY_MS, timeZone);
  const fits = [wallMs - before, wallMs - after].filter((ms) => formatInTimeZone(ms, timeZone, WALL) === wall);
  return new Date(fits.length ? Math.min(...fits) : wallMs - before);
}

/** The instant a local date (and whole hour) happens in the zone; days past the month's end roll over. */
export function zonedToUtc(year: number, month1: number, day: number, timeZone: string, hour = 0): Date {
  // setUTCFullYear takes years below 100 as written (Date.UTC would read 99 as 1999, ECMA-262 MakeFullYear).
  const d = new Date(Date.UTC(2000, 0, 1));
  d.setUTCFullYear(year, month1 - 1, day);
  return wallTimeToUtc(`${pad(d.getUTCFullYear(), 4)}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())}T${pad(hour)}:00:00`, timeZone);
}

export interface MonthRange {
  month: string;
  /** Local midnight starting the 1st, as a UTC instant. */
  start: Date;
  /** Local midnight starting the next month's 1st (exclusive). */
  end: Date;
}

/** The month "YYYY-MM" in the zone as [start, end) instants; a month with a clock change is an hour shorter or longer. */
export function monthRange(month: string, timeZone: string): MonthRange {
  const m = /^(\d{4})-(0[1-9]|1[0-2])$/.exec(month);
  if (!m) throw new RangeError(`month must look like 2026-11, not "${month}"`);
  const year = Number(m[1]);
  const month1 = Number(m[2]);
  return { month, start: zonedToUtc(year, month1, 1, timeZone), end: zonedToUtc(year, month1 + 1, 1, timeZone) };
}

/** The month "YYYY-MM" an instant falls in, in the zone. */
export const monthOf = (instant: Date, timeZone: string): string => formatInTimeZone(instant, timeZone, 'yyyy-MM');

/** The local calendar date "YYYY-MM-DD" of an instant in the zone. */
export const localDate = (instant: Date, timeZone: string): string => formatInTimeZone(instant, timeZone, 'yyyy-MM-dd');

/** Minutes after local midnight at an instant in the zone. */
export function localMinutes(instant: Date, timeZone: string): number {
  const [h, m] = formatInTimeZone(instant, timeZone, 'HH:mm').split(':').map(Number);
  return h * 60 + m;
}

/** "14:20" in the zone, or "3 Nov, 14:20" when the instant is not on the same local day as `now`. */
export function localClock(instant: Date, timeZone: string, now: Date): string {
  const clock = formatInTimeZone(instant, timeZone, 'HH:mm');
  return localDate(instant, timeZone) === localDate(now, timeZone) ? clock : `${formatInTimeZone(instant, timeZone, 'd MMM')}, ${clock}`;
}
