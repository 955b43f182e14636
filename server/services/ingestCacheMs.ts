/**
 * How long ingest trusts what it cached (token lookups, network thresholds, radio inventory). An edit
 * made through this process forgets the entry at once; another instance's edit is seen when the entry
 * expires, so this is also the longest a revoked token keeps working anywhere. Set from config.
 */
let cacheMs = 3000;
export const ingestCacheMs = () => cacheMs;
export function setIngestCacheMs(ms: number) {
  cacheMs = ms;
}
