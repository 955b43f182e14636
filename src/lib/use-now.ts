import { useEffect, useState } from 'react';

/** The clock for "down 2 h"-style figures: read once when mounted, then again every `everyMs`, so they stay current. */
export function useNow(everyMs = 30_000): number {
  const [now, setNow] = useState(() => Date.now());
  useEffect(() => {
    const timer = window.setInterval(() => setNow(Date.now()), everyMs);
    return () => window.clearInterval(timer);
  }, [everyMs]);
  return now;
}
