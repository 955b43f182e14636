import type { Sequelize } from 'sequelize';
import type { Config } from '../config';
import { runStorageUpkeep } from './heartbeatStorage';
import { runSilenceCheck } from './silenceCheck';

/** Every interval: the silence check; every minute: storage upkeep. Both run in one process at a time. */
export function startJobs(config: Config, sequelize: Sequelize) {
  let running = false;
  let lastUpkeep = 0;
  const tick = async () => {
    if (running) return;
    running = true;
    try {
      const now = config.now();
      await runSilenceCheck(sequelize, now, config.healthCheckIntervalMs);
      if (now.getTime() - lastUpkeep >= 60_000) {
        lastUpkeep = now.getTime();
        await runStorageUpkeep(sequelize, now, { daysAhead: config.partitionDaysAhead, rawDays: config.rawRetentionDays, rollupDays: config.rollupRetentionDays });
      }
    } catch (err) {
      console.error('scheduled job failed:', (err as Error).message);
    } finally {
      running = false;
    }
  };
  const timer = setInterval(() => void tick(), config.healthCheckIntervalMs);
  void tick();
  return { stop: () => clearInterval(timer), tick };
}
