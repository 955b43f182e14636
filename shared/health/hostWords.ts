import type { NodeState } from '../enums';

export interface HostSummaryInput {
  siteName: string;
  state: NodeState;
  /** "14:20" or "3 Jun, 14:20" in the network's time zone (shared/time/monthRange localClock). */
  lastSeenClock: string | null;
  /** When the current state began, same format. */
  sinceClock: string | null;
}

/** One sentence a resident understands at a glance; what to do, if anything, and whether people know. */
export function hostSummary({ siteName, state, lastSeenClock, sinceClock }: HostSummaryInput): string {
  const node = `Your node on ${siteName}`;
  switch (state) {
    case 'online':
      return `${node} is working normally.`;
    case 'degraded':
      return `${node} is working, but its signal or speed has been weaker than it should be${sinceClock ? ` since ${sinceClock}` : ''}; the operators can see this and will look into it.`;
    case 'offline':
      return lastSeenClock
        ? `${node} has not reported since ${lastSeenClock}; the operators have been told.`
        : `${node} is not reporting; the operators have been told.`;
    case 'stranded':
      return `${node} looks fine, but a link further along the network is down${sinceClock ? ` since ${sinceClock}` : ''}, so it cannot reach the internet. Nothing needs checking at your end; the operators have been told.`;
    case 'maintenance':
      return `${node} is in an announced power-off or maintenance window; no one is alerted while it lasts.`;
    case 'unknown':
      return `${node} has not reported yet. Once it is installed and powered, it will show here within a few minutes.`;
  }
}
