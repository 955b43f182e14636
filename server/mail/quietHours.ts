// Quiet hours are wall-clock times in the network's time zone. Pure; the clock is passed in.

/** Minutes after local midnight at `at` in `timeZone` (an unknown zone reads as UTC). */
export function localMinutes(at: Date, timeZone: string): number {
  let parts: Intl.DateTimeFormatPart[];
  try {
    parts = new Intl.DateTimeFormat('en-GB', { timeZone, hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).formatToParts(at);
  } catch {
    parts = new Intl.DateTimeFormat('en-GB', { timeZone: 'UTC', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).formatToParts(at);
  }
  const get = (type: string) => Number(parts.find((p) => p.type === type)?.value ?? 0);
  return get('hour') * 60 + get('minute');
}

/** "22:00" or "22:00:00" → 1320. */
export const clockMinutes = (hhmm: string) => {
  const [h, m] = hhmm.split(':').map(Number);
  return h * 60 + m;
};

/**
 * When a message written at `now` may go out: `now` outside the quiet span, else the span's end.
 * Spans may cross midnight (22:00–07:00). Common practice, no source: the delay is counted in
 * wall-clock minutes, so on a daylight-saving night the mail may leave an hour early or late.
 */
export function quietUntil(now: Date, timeZone: string, start: string | null, end: string | null): Date {
  if (!start || !end) return now;
  const s = clockMinutes(start);
  const e = clockMinutes(end);
  const t = localMinutes(now, timeZone);
  const inside = s < e ? t >= s && t < e : t >= s || t < e;
  if (!inside) return now;
  const waitMin = (e - t + 1440) % 1440;
  const startOfMinute = now.getTime() - (now.getTime() % 60_000);
  return new Date(startOfMinute + waitMin * 60_000);
}
