import { QueryTypes } from 'sequelize';
import { describe, expect, it } from 'vitest';
import { startJobs } from '../../server/jobs/scheduler';
import { Node } from '../../server/models';
import { useApi } from '../helpers/api';
import { alertScene } from '../helpers/alertScene';
import { clearInbox, mailTo } from '../helpers/mailFake';

// A measurement, not a timed assertion: it prints how long after a node's last report its
// operator's mail is in the fake's inbox, with the real clock and short, realistic intervals.
describe('time from the last report to the outage mail', () => {
  const ctx = useApi({ healthCheckIntervalMs: 1000 });

  it('prints the delay with a 10 s report interval and a 1 s check interval', { timeout: 90_000 }, async () => {
    await clearInbox();
    const s = await alertScene(ctx);
    await Node.update({ reportIntervalS: 10 }, { where: { id: s.node.id } });
    const jobs = startJobs(ctx.config, ctx.sequelize);
    try {
      await new Promise((r) => setTimeout(r, 1500));
      expect((await s.report()).status).toBe(202);
      const lastReportAt = Date.now();
      let arrivedAt = 0;
      while (!arrivedAt && Date.now() - lastReportAt < 80_000) {
        await new Promise((r) => setTimeout(r, 100));
        if ((await mailTo([s.operator.email, s.host.email])).length === 2) arrivedAt = Date.now();
      }
      expect(arrivedAt).toBeGreaterThan(0);
      const delayS = (arrivedAt - lastReportAt) / 1000;
      const thresholdS = 10 * 3;
      console.log(
        `[alert latency] last report → operator mail in the inbox: ${delayS.toFixed(1)} s ` +
          `(offline threshold ${thresholdS} s = 3 × 10 s report interval; ${(delayS - thresholdS).toFixed(1)} s of detection and delivery)`,
      );
      const [row] = await ctx.sequelize.query<{ created: Date; sent: Date }>(
        `SELECT min(created_at) AS created, max(sent_at) AS sent FROM outbox WHERE node_id = $1`,
        { bind: [s.node.id], type: QueryTypes.SELECT },
      );
      console.log(
        `[alert latency] written to the outbox ${((new Date(row.created).getTime() - lastReportAt) / 1000).toFixed(1)} s after the last report; ` +
          `both mails accepted by SMTP ${((new Date(row.sent).getTime() - new Date(row.created).getTime()) / 1000).toFixed(1)} s after that`,
      );
      expect(await mailTo([s.host.email])).toHaveLength(1);
    } finally {
      jobs.stop();
      await new Promise((r) => setTimeout(r, 1200));
    }
  });
});
