// Calendar months in a named IANA time zone, through the platform's own tz database (Intl).

const formatters = new Map<string, Intl.DateTimeFormat>();
function formatter(timeZone: string) {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-GB', { timeZone, hourCycle: 'h23', year: 'numeric', month: 'numeric', day: 'numeric', hour: 'numeric', minute: 'numeric', second: 'numeric' });
    formatters.set(timeZone, f);
  }
  return f;
}

/** Whether the platform knows the zone name. */
export function isTimeZone(timeZone: string): boolean {
  try {
    formatter(timeZone);
    return true;
  } catch {
    return false;
  }
}

// Date.UTC reads years 0–99 as 1900–1999 (ECMA-262 MakeFullYear); setUTCFullYear takes the year as given.
const utcMs = (year: number, month1: number, day: number, hour = 0, minute = 0, second = 0) =>
  new Date(Date.UTC(2000, 0, 1, hour, minute, second)).setUTCFullYear(year, month1 - 1, day);

/** The zone's offset from UTC at an instant, in minutes (east positive). */
export function zoneOffsetMin(instant: Date, timeZone: string): number {
  const parts = Object.fromEntries(formatter(timeZone).formatToParts(instant).map((p) => [p.type, p.value]));
  const asUtc = utcMs(+parts.year, +parts.month, +parts.day, +parts.hour, +parts.minute, +parts.second);
  return Math.round((asUtc - Math.floor(instant.getTime() / 1000) * 1000) / 60_000);
}

/** The instant a local wall-clock time happens in the zone (a skipped time resolves forward). */
export function zonedToUtc(year: number, month1: number, day: number, timeZone: string, hour = 0): Date {
  const wall = utcMs(year, month1, day, hour);
  // Two passes settle the offset even when the first guess lands across a change.
  let guess = wall - zoneOffsetMin(new Date(wall), timeZone) * 60_000;
  guess = wall - zoneOffsetMin(new Date(guess), timeZone) * 60_000;
  return new Date(guess);
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
  const next = month1 === 12 ? { year: year + 1, month1: 1 } : { year, month1: month1 + 1 };
  return { month, start: zonedToUtc(year, month1, 1, timeZone), end: zonedToUtc(next.year, next.month1, 1, timeZone) };
}

/** The month "YYYY-MM" an instant falls in, in the zone. */
export function monthOf(instant: Date, timeZone: string): string {
  const local = new Date(instant.getTime() + zoneOffsetMin(instant, timeZone) * 60_000);
  return `${local.getUTCFullYear()}-${String(local.getUTCMonth() + 1).padStart(2, '0')}`;
}

/** "14:20" in the zone, or "3 Nov, 14:20" when the instant is not on the same local day as `now`. */
export function localClock(instant: Date, timeZone: string, now: Date): string {
  const opts: Intl.DateTimeFormatOptions = { timeZone, hourCycle: 'h23', hour: '2-digit', minute: '2-digit' };
  const day = (d: Date) => new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(d);
  const clock = new Intl.DateTimeFormat('en-GB', opts).format(instant);
  if (day(instant) === day(now)) return clock;
  const date = new Intl.DateTimeFormat('en-GB', { timeZone, day: 'numeric', month: 'short' }).format(instant);
  return `${date}, ${clock}`;
}
