// A node's own clock, judged against the server's. The bounds are API.md's rule (Parapet's own
// choice, not a published figure): before 2020-01-01, or more than a day ahead, is plainly wrong.
export const EARLIEST_PLAUSIBLE_MS = Date.UTC(2020, 0, 1);
export const MAX_AHEAD_MS = 24 * 3_600_000;

export type ClockTrouble = 'unreadable' | 'too-early' | 'ahead';

export interface JudgedSentAt {
  /** The time to store (ISO 8601 UTC), or null when the node's clock cannot be trusted. */
  sentAt: string | null;
  trouble: ClockTrouble | null;
}

export function judgeSentAt(reported: string, now: Date): JudgedSentAt {
  const ms = Date.parse(reported);
  if (!Number.isFinite(ms)) return { sentAt: null, trouble: 'unreadable' };
  if (ms < EARLIEST_PLAUSIBLE_MS) return { sentAt: null, trouble: 'too-early' };
  if (ms > now.getTime() + MAX_AHEAD_MS) return { sentAt: null, trouble: 'ahead' };
  return { sentAt: new Date(ms).toISOString(), trouble: null };
}

/** A sentence for the node page. */
export function clockTroubleText(trouble: ClockTrouble, reported: string): string {
  const said = `The node said it sent its last report at ${reported}`;
  if (trouble === 'ahead') return `${said}, more than a day ahead of Parapet's clock.`;
  if (trouble === 'too-early') return `${said}, before 2020.`;
  return `${said}, which is not a time Parapet can read.`;
}
