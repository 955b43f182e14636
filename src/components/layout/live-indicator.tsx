import { useLiveStatus, type LiveStatus } from '../../lib/socket';

const LOOK: Record<LiveStatus, { word: string; title: string; dot: string }> = {
  live: { word: 'Live', title: 'Connected: changes appear as they happen.', dot: 'bg-accent' },
  connecting: { word: 'Connecting…', title: 'Opening the live connection.', dot: 'bg-muted animate-pulse' },
  reconnecting: {
    word: 'Reconnecting…',
    title: 'The live connection dropped; pages may be behind until it is back.',
    dot: 'border-2 border-caution bg-transparent animate-pulse',
  },
  closed: { word: 'Not live', title: 'No live connection.', dot: 'border-2 border-muted bg-transparent' },
};

/** Whether changes are reaching this page; a filled dot when live, a hollow one when not. */
export function LiveIndicator() {
  const status = useLiveStatus();
  const look = LOOK[status];
  return (
    <span
      data-testid="live-indicator"
      data-status={status}
      title={look.title}
      role="status"
      className="inline-flex shrink-0 items-center gap-1.5 rounded-full px-2 py-0.5 text-xs font-medium text-muted"
    >
      <span aria-hidden="true" className={`inline-block h-2.5 w-2.5 rounded-full ${look.dot}`} />
      <span className="max-sm:sr-only">{look.word}</span>
    </span>
  );
}
