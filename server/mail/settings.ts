import type { Config } from '../config';

// The outbox is written inside health transitions deep in ingest and the silence check; they
// reach the process's settings (links, secret, grace, caps) here rather than through every caller.
let current: Config | null = null;

export function useMailConfig(config: Config): void {
  current = config;
}

export function mailConfig(): Config | null {
  return current;
}
