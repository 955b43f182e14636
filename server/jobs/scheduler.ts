import type { Sequelize } from 'sequelize';
import type { Config } from '../config';
import type { DatabaseWatch, Outage } from '../db/availability';
import { runAlertSweep } from './alertSweep';
import { runStorageUpkeep } from './heartbeatStorage';
import { runOutboxSender } from './outboxSender';
import { runSilenceCheck } from './silenceCheck';

/**
 * Every interval: the silence check and the mail rules, then the outbox sender; every minute:
 * storage upkeep. Each runs in one process at a time. The sender has its own loop so a slow mail
 * server never holds up the silence check. While the database is unreachable every tick is
 * skipped; the first check after it returns treats the gap as Parapet's own downtime.
 */
export function startJobs(config: Config, sequelize: Sequelize, watch?: DatabaseWatch) {
  let running = false;
  let sending = false;
  let lastUpkeep = 0;
  let skipped = 0;
  let stopped = false;
  const inflight = new Set<Promise<void>>();
  const track = (p: Promise<void>) => {
    inflight.add(p);
    void p.finally(() => inflight.delete(p));
    return p;
  };
  let outagesHandled = watch?.outageCount ?? 0;
  const failed = (what: string, err: unknown) => {
    if (!watch?.reportFailure(err)) console.error(`${what} failed:`, (err as Error).message);
  };
  const send = async () => {
    if (stopped || sending || (watch && !watch.up)) return;
    sending = true;
    try {
      await runOutboxSender(sequelize, config);
    } catch (err) {
      failed('outbox sender', err);
    } finally {
      sending = false;
    }
  };
  const tick = async () => {
    if (stopped || running) return;
    if (watch && !watch.up) {
      if (skipped++ === 0) console.log('scheduled jobs paused: the database is unreachable');
      return;
    }
    running = true;
    try {
      const now = config.now();
      // Outages of the database since the last good check: silence in them is Parapet's, not the nodes'.
      const seen = watch?.outageCount ?? 0;
      const ownOutage: Outage | null = seen > outagesHandled ? (watch!.outages.at(-1) ?? null) : null;
      const checkStarted = performance.now();
      const check = await runSilenceCheck(sequelize, config, now, config.healthCheckIntervalMs, config.rootCauseWindowS, ownOutage);
      // JOB_TIMINGS_LOG=true: one line per tick, read by `npm run bench:town` (every tick must stay well under the interval).
      if (config.jobTimingsLog) {
        const ms = (performance.now() - checkStarted).toFixed(1);
        console.log(`job timing: silence-check ${ms} ms (${check.leader ? `leader, ${check.silenced} silenced` : 'not leader'})`);
      }
      outagesHandled = seen;
      if (skipped) console.log(`scheduled jobs resumed after ${skipped} skipped tick(s)`);
      skipped = 0;
      await runAlertSweep(sequelize, config, now);
      if (now.getTime() - lastUpkeep >= 60_000) {
        lastUpkeep = now.getTime();
        await runStorageUpkeep(sequelize, now, {
          daysAhead: config.partitionDaysAhead,
          rawDays: config.rawRetentionDays,
          rollupDays: config.rollupRetentionDays,
        });
      }
    } catch (err) {
      failed('scheduled job', err);
    } finally {
      running = false;
    }
    void track(send());
  };
  const timer = setInterval(() => void track(tick()), config.healthCheckIntervalMs);
  void track(tick());
  /** Stops the timer and resolves once the round in progress (if any) has finished. */
  const stop = async () => {
    stopped = true;
    clearInterval(timer);
    await Promise.allSettled([...inflight]);
  };
  return { stop, tick, send };
}
