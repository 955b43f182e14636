import { QueryTypes, type Sequelize } from 'sequelize';
import type { Config } from '../config';
import { writeDegradedDigests, writeHourlyDigests } from '../services/alertDigests';
import { writeDueOfflineAlerts, writeReminders } from '../services/alerts';
import { asLeader } from './leader';

/**
 * The mail rules that wait on the clock, one process at a time: offline mail whose grace has now
 * passed, reminders for open unacknowledged outages, the hourly and the daily digests.
 */
export async function runAlertSweep(sequelize: Sequelize, config: Config, now: Date) {
  const result = await asLeader(sequelize, 'alert-sweep', async (transaction) => {
    const q = { type: QueryTypes.SELECT, transaction } as const;
    const offlineOutages = await writeDueOfflineAlerts(sequelize, config, now, transaction);
    const remind = await sequelize.query<{ id: number }>(
      `SELECT o.id FROM outages o
        WHERE o.ended_at IS NULL AND o.acknowledged_at IS NULL AND o.offline_notified_at IS NOT NULL
          AND coalesce(o.last_reminder_at, o.offline_notified_at) + make_interval(secs => $2) <= $1
        ORDER BY o.id FOR UPDATE OF o`,
      { ...q, bind: [now, config.reminderIntervalS] },
    );
    let reminders = 0;
    for (const o of remind) reminders += await writeReminders(sequelize, config, o.id, now, transaction);
    const hourly = await writeHourlyDigests(sequelize, config, now, transaction);
    const daily = await writeDegradedDigests(sequelize, config, now, transaction);
    return { offlineOutages, reminders, hourly, daily };
  });
  return result ?? { offlineOutages: 0, reminders: 0, hourly: 0, daily: 0 };
}
