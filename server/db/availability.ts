import { EventEmitter } from 'node:events';
import type pg from 'pg';
import { BaseError, ConnectionAcquireTimeoutError, ConnectionError } from 'sequelize';

// PostgreSQL error classes that mean "the server is not there right now", not "your query is wrong":
// 08 connection exception, 57P01–57P03 shutdown/crash/starting up, 53300 too many connections.
const UNREACHABLE_CODES = new Set([
  '08000',
  '08001',
  '08003',
  '08004',
  '08006',
  '57P01',
  '57P02',
  '57P03',
  '53300',
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  'ENOTFOUND',
  'EHOSTUNREACH',
  'EAI_AGAIN',
]);
// node-postgres raises these without a code.
const UNREACHABLE_TEXT = new RegExp(
  [
    'Connection terminated',
    'timeout exceeded when trying to connect',
    'Client has encountered a connection error',
    'Connection is closed',
    'the database system is (starting up|shutting down|in recovery mode)',
    'terminating connection',
  ].join('|'),
  'i',
);

/** True when an error (or the one it wraps) says the database cannot be reached, whatever the query was. */
export function isDatabaseUnreachable(err: unknown): boolean {
  for (let e = err as { code?: string; message?: string; parent?: unknown; original?: unknown } | undefined, depth = 0; e && depth < 4; depth++) {
    // Waiting too long for a free connection of this process's own pool is load here, not a database away.
    if (e instanceof ConnectionAcquireTimeoutError) return false;
    if (e instanceof ConnectionError) return true;
    if (typeof e.code === 'string' && UNREACHABLE_CODES.has(e.code)) return true;
    if (typeof e.message === 'string' && UNREACHABLE_TEXT.test(e.message)) return true;
    e = (e.parent ?? e.original) as typeof e;
  }
  return false;
}

/** Any error from the database layer (driver or ORM), for deciding whether an outage explains it. */
export const isDatabaseError = (err: unknown) =>
  err instanceof BaseError || (typeof (err as { code?: unknown })?.code === 'string' && typeof (err as { severity?: unknown }).severity === 'string');

export interface Outage {
  from: Date;
  to: Date;
}

/**
 * What this process last saw of PostgreSQL. A failure marks it down and starts probing every
 * `probeIntervalMs`; the first probe that answers marks it up again. While down, callers answer
 * 503 at once instead of waiting on connection timeouts. Emits `down` and `up` (with the outage).
 */
export class DatabaseWatch extends EventEmitter {
  private downSince: Date | null = null;
  private timer: NodeJS.Timeout | null = null;
  private stopped = false;
  /** Outages that have ended, oldest first (only the last few are kept). */
  readonly outages: Outage[] = [];
  outageCount = 0;

  constructor(
    private readonly probe: () => Promise<unknown>,
    private readonly probeIntervalMs: number,
    private readonly now: () => Date = () => new Date(),
  ) {
    super();
  }

  get up() {
    return this.downSince === null;
  }

  get since() {
    return this.downSince;
  }

  /** Called with any error a database call raised; only unreachability marks the database down. */
  reportFailure(err: unknown) {
    if (!isDatabaseUnreachable(err) || this.stopped) return false;
    if (this.downSince) return true;
    this.downSince = this.now();
    console.error(`database unreachable (${String((err as Error)?.message ?? err).slice(0, 200)}); answering 503 and probing every ${this.probeIntervalMs} ms`);
    this.emit('down', this.downSince);
    this.schedule();
    return true;
  }

  private schedule() {
    if (this.stopped || this.timer) return;
    this.timer = setTimeout(() => void this.check(), this.probeIntervalMs);
    this.timer.unref?.();
  }

  private async check() {
    this.timer = null;
    try {
      await this.probe();
    } catch {
      this.schedule();
      return;
    }
    if (!this.downSince) return;
    const outage = { from: this.downSince, to: this.now() };
    this.downSince = null;
    this.outages.push(outage);
    if (this.outages.length > 20) this.outages.shift();
    this.outageCount++;
    console.log(`database reachable again after ${((outage.to.getTime() - outage.from.getTime()) / 1000).toFixed(1)} s`);
    this.emit('up', outage);
  }

  stop() {
    this.stopped = true;
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
  }
}

/**
 * node-postgres emits `error` on a client that is checked out when its server goes away; with no
 * listener that ends the process. Every client of this pool gets one, and tells the watch.
 */
export function guardPool(pool: pg.Pool, label: string, watch?: DatabaseWatch) {
  pool.on('error', (err) => {
    console.error(`${label}: idle connection lost: ${err.message}`);
    watch?.reportFailure(err);
  });
  pool.on('connect', (client) => {
    client.on('error', (err) => {
      console.error(`${label}: connection lost: ${err.message}`);
      watch?.reportFailure(err);
    });
  });
  return pool;
}
