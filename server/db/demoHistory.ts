// Loads about five weeks of Lindenfall's past: raw reports in bulk, the planned events replayed
// through the live rules, then the live roll-up and retention code over the whole span.
import { QueryTypes, type Sequelize } from 'sequelize';
import type { Config } from '../config';
import { applyRetention, rollUp } from '../jobs/heartbeatStorage';
import { ingestReports } from '../services/heartbeatIngest';
import { planHistory } from './demoHistoryPlan';
import { reportSpecs, writeDay } from './demoHistoryReports';
import { deliverDue, replayHistory, reportAt, tokenNode } from './demoHistoryReplay';
import { TOWN } from './demoScenario';

const DAY_MS = 86_400_000;

export interface HistorySummary {
  days: number;
  reportRows: number;
  steps: number;
  outages: number;
  mails: number;
}

export async function loadDemoHistory(
  sequelize: Sequelize,
  config: Config,
  people: Map<string, number>,
  progress: (line: string) => void,
): Promise<HistorySummary> {
  const plan = planHistory(config.now());
  const specs = await reportSpecs(sequelize);
  await sequelize.query(
    `UPDATE nodes SET created_at = $1::timestamptz - interval '1 day', first_seen_at = $1, last_seen_at = $1, state = 'online', state_since = $1,
            health_streak = 0, health_reason = NULL WHERE id = ANY($2::int[])`,
    { bind: [plan.start, [...specs.ids.values()]] },
  );
  await sequelize.query(`UPDATE sites SET created_at = $1::timestamptz - interval '1 day' WHERE id IN (SELECT site_id FROM nodes WHERE id = ANY($2::int[]))`, {
    bind: [plan.start, [...specs.ids.values()]],
  });

  const days: Date[] = [];
  for (let t = plan.start.getTime(); t < plan.end.getTime(); t += DAY_MS) days.push(new Date(t));
  let reportRows = 0;
  for (const [i, day] of days.entries()) {
    reportRows += await writeDay(sequelize, plan, specs, day, TOWN.timeZone);
    if ((i + 1) % 5 === 0 || i === days.length - 1) progress(`history: reports for ${i + 1} of ${days.length} days written (${reportRows} rows)`);
  }
  // The reports were written around the store function, so its per-node watermark no longer speaks for them: unknown,
  // and each node's next store looks the highest stored seq up again (migration 0017).
  await sequelize.query('UPDATE nodes SET stored_boot_id = NULL, stored_seq = NULL WHERE id = ANY($1::int[])', { bind: [[...specs.ids.values()]] });
  progress('history: replaying outages, acknowledgements, maintenance and mail through the live rules');
  const steps = await replayHistory(sequelize, config, plan, specs, people);

  // A week per call: the roll-up reads each raw table once per call, so fewer, larger spans are cheaper.
  for (let i = 0; i < days.length; i += 7) {
    const from = days[i].getTime();
    const until = Math.min(from + 7 * DAY_MS, plan.end.getTime());
    await rollUp(sequelize, new Date(until), 300, Math.floor((until - from) / 300_000));
    await rollUp(sequelize, new Date(until), 3600, Math.floor((until - from) / 3_600_000));
    progress(`history: roll-ups for ${Math.min(i + 7, days.length)} of ${days.length} days`);
  }
  await applyRetention(sequelize, plan.end, config.rawRetentionDays, config.rollupRetentionDays);
  progress('history: retention applied');

  // Every node reports once now, so the console opens on fresh figures (and the drifting link shows).
  for (const nodeId of specs.ids.values()) {
    await ingestReports(sequelize, config, await tokenNode(sequelize, nodeId), [reportAt(specs, nodeId, plan.end, plan.drift.depthDb)], plan.end);
  }
  progress('history: every node reported once now');
  // Mail of the past went out in its day (see deliverDue); what is due later waits for the live sender.
  await deliverDue(sequelize, plan.end);
  const [mails] = await sequelize.query<{ n: string }>('SELECT count(*) AS n FROM outbox WHERE node_id = ANY($1::int[])', {
    bind: [[...specs.ids.values()]],
    type: QueryTypes.SELECT,
  });
  // The live check starts watching afresh, as on a first start (no notice about the replay's clock).
  await sequelize.query(`UPDATE job_state SET last_run_at = NULL, watching_since = NULL WHERE name = 'silence-check'`);
  const [counts] = await sequelize.query<{ outages: string }>('SELECT count(*) AS outages FROM outages WHERE node_id = ANY($1::int[])', {
    bind: [[...specs.ids.values()]],
    type: QueryTypes.SELECT,
  });
  return { days: days.length, reportRows, steps, outages: Number(counts.outages), mails: Number(mails.n) };
}
