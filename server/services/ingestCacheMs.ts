/**
 * How long ingest trusts what it cached (token lookups, network thresholds, radio inventory). An edit made
 * through this process forgets the entry at once. While this process hears the database's change notices
 * (ingestCaches.ts, migration 0019), every other edit is forgotten when it commits, and an entry lives
 * LISTENING_CACHE_MS; otherwise another instance's edit is seen when the entry expires after the configured
 * time, which is then also the longest a revoked token keeps working anywhere.
 */
let cacheMs = 3000;
let listening = false;
/** The longest an entry lives while notices are heard: a safety net only, notices do the work. */
export const LISTENING_CACHE_MS = 10 * 60_000;
export const ingestCacheMs = () => (listening ? LISTENING_CACHE_MS : cacheMs);
export function setIngestCacheMs(ms: number) {
  cacheMs = ms;
}
export function setHearingChanges(on: boolean) {
  listening = on;
}

// A lookup that started before a forget must not store what it read: it may predate the change.
let generation = 0;
export const cacheGeneration = () => generation;
export function cachesForgot() {
  generation++;
}
