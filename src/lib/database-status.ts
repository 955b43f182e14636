import { useSyncExternalStore } from 'react';
import { queryClient } from './query-client';

// Whether the server last said it cannot reach its database (503 database_unavailable). While it
// does, one health probe every few seconds notices its return; then every query refetches.
const PROBE_MS = 3_000;
let downSince: number | null = null;
let timer: ReturnType<typeof setTimeout> | null = null;
const listeners = new Set<() => void>();
const notify = () => listeners.forEach((l) => l());

async function probe() {
  timer = null;
  try {
    const response = await fetch('/api/health', { headers: { Accept: 'application/json' }, cache: 'no-store' });
    if (response.ok) {
      downSince = null;
      notify();
      void queryClient.invalidateQueries();
      return;
    }
  } catch {
    // the server itself is unreachable: keep the banner and keep asking
  }
  timer = setTimeout(() => void probe(), PROBE_MS);
}

export function markDatabaseUnavailable() {
  if (downSince === null) {
    downSince = Date.now();
    notify();
  }
  timer ??= setTimeout(() => void probe(), PROBE_MS);
}

export function useDatabaseDownSince(): number | null {
  return useSyncExternalStore(
    (listener) => {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    () => downSince,
  );
}
