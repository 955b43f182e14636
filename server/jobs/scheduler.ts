import type { Sequelize } from 'sequelize';
import type { Config } from '../config';
import { runAlertSweep } from './alertSweep';
import { runStorageUpkeep } from './heartbeatStorage';
import { runOutboxSender } from './outboxSender';
import { runSilenceCheck } from './silenceCheck';

/**
 * Every interval: the silence check and the mail rules, then the outbox sender; every minute:
 * storage upkeep. Each runs in one process at a time. The sender has its own loop so a slow mail
 * server never holds up the silence check.
 */
export function startJobs(config: Config, sequelize: Sequelize) {
  let running = false;
  let sending = false;
  let lastUpkeep = 0;
  const send = async () => {
    if (sending) return;
    sending = true;
    try {
      await runOutboxSender(sequelize, config);
    } catch (err) {
      console.error('outbox sender failed:', (err as Error).message);
    } finally {
      sending = false;
    }
  };
  const tick = async () => {
    if (running) return;
    running = true;
    try {
      const now = config.now();
      await runSilenceCheck(sequelize, now, config.healthCheckIntervalMs, config.rootCauseWindowS);
      await runAlertSweep(sequelize, config, now);
      if (now.getTime() - lastUpkeep >= 60_000) {
        lastUpkeep = now.getTime();
        await runStorageUpkeep(sequelize, now, { daysAhead: config.partitionDaysAhead, rawDays: config.rawRetentionDays, rollupDays: config.rollupRetentionDays });
      }
    } catch (err) {
      console.error('scheduled job failed:', (err as Error).message);
    } finally {
      running = false;
    }
    void send();
  };
  const timer = setInterval(() => void tick(), config.healthCheckIntervalMs);
  void tick();
  return { stop: () => clearInterval(timer), tick, send };
}
