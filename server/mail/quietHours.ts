// Quiet hours are wall-clock times in the network's time zone. Pure; the clock is passed in.
import { isTimeZone, localDate, localMinutes as zonedMinutes, wallTimeToUtc } from '../../shared/time/monthRange';

const knownZone = (timeZone: string) => (isTimeZone(timeZone) ? timeZone : 'UTC');

/** Minutes after local midnight at `at` in `timeZone` (an unknown zone reads as UTC). */
export const localMinutes = (at: Date, timeZone: string): number => zonedMinutes(at, knownZone(timeZone));

/** "22:00" or "22:00:00" → 1320. */
export const clockMinutes = (hhmm: string) => {
  const [h, m] = hhmm.split(':').map(Number);
  return h * 60 + m;
};

/**
 * When a message written at `now` may go out: `now` outside the quiet span, else the span's end
 * as a wall-clock time in the zone (so across a daylight-saving change it ends at the local hour
 * asked for, not a fixed count of minutes later). Spans may cross midnight (22:00–07:00).
 */
export function quietUntil(now: Date, timeZone: string, start: string | null, end: string | null): Date {
  if (!start || !end) return now;
  const zone = knownZone(timeZone);
  const s = clockMinutes(start);
  const e = clockMinutes(end);
  const t = localMinutes(now, zone);
  const inside = s < e ? t >= s && t < e : t >= s || t < e;
  if (!inside) return now;
  // The end is later today if its clock time is still ahead, else tomorrow (local calendar days).
  const [y, m, d] = localDate(now, zone).split('-').map(Number);
  const day = new Date(Date.UTC(2000, 0, 1));
  day.setUTCFullYear(y, m - 1, d + (e > t ? 0 : 1));
  const hhmm = `${String(Math.floor(e / 60)).padStart(2, '0')}:${String(e % 60).padStart(2, '0')}`;
  return wallTimeToUtc(`${day.toISOString().slice(0, 10)}T${hhmm}:00`, zone);
}
