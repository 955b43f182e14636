import { QueryTypes } from 'sequelize';
import { beforeEach, describe, expect, it } from 'vitest';
import { runAlertSweep } from '../../server/jobs/alertSweep';
import { runSilenceCheck } from '../../server/jobs/silenceCheck';
import { Node, Outage } from '../../server/models';
import { buildUser, call, signIn, useApi } from '../helpers/api';
import { alertScene, outboxRows, sendOutbox, setPreferences, silenceCheck } from '../helpers/alertScene';
import { manualClock } from '../helpers/clock';
import { buildNode } from '../helpers/factories';
import { clearInbox, mailTo } from '../helpers/mailFake';

const clock = manualClock();
// Report interval 60 s (the default) and three missed intervals: offline 180 s after the last report.
const OFFLINE_AFTER_S = 181;
let day = 1;

describe('outage mail', () => {
  const ctx = useApi({ now: clock.now });
  beforeEach(async () => {
    clock.set(`2026-07-${String(day++).padStart(2, '0')}T12:00:00Z`);
    ctx.config.alertGraceS = null;
    await clearInbox();
    await silenceCheck(ctx); // starts watching afresh for this test's day
  });

  it('a node going silent mails its host and its neighbourhood’s operators once, and nobody else', async () => {
    const s = await alertScene(ctx);
    expect((await s.report()).status).toBe(202);
    clock.advance(OFFLINE_AFTER_S);
    await silenceCheck(ctx);
    expect((await Node.findByPk(s.node.id))!.state).toBe('offline');
    expect((await sendOutbox(ctx)).sent).toBeGreaterThanOrEqual(2);
    await sendOutbox(ctx);
    await silenceCheck(ctx);
    await sendOutbox(ctx);

    const mail = await mailTo(s.addresses(...s.everyone));
    expect(mail.map((m) => m.to[0].address).sort()).toEqual([s.host.email, s.operator.email].sort());
    const hostMail = mail.find((m) => m.to[0].address === s.host.email)!;
    const opMail = mail.find((m) => m.to[0].address === s.operator.email)!;
    expect(hostMail.subject).toContain(s.node.name);
    // The host checklist, in order, with the safety caution and the operators to contact by name.
    const order = ['Power:', 'power-over-Ethernet injector', 'The cable at the radio', 'The antenna'].map((w) => hostMail.text.indexOf(w));
    expect(order.every((i) => i >= 0)).toBe(true);
    expect([...order].sort((a, b) => a - b)).toEqual(order);
    expect(hostMail.text).toMatch(/Safety: Do not climb onto the roof or up a ladder/);
    expect(hostMail.text).toContain('licensed');
    expect(hostMail.text).toContain(s.operator.name);
    // The operator version: figures, a link to the node page, an acknowledge link.
    expect(opMail.subject).toMatch(/^Offline: /);
    expect(opMail.text).toContain('Weakest signal: -60 dBm');
    expect(opMail.text).toContain(`/nodes/${s.node.id}`);
    expect(opMail.text).toMatch(/\/api\/v1\/mail-links\/acknowledge\?t=acknowledge\./);
    expect(hostMail.text).not.toContain('acknowledge?t=');
    for (const m of mail) expect(m.html).toContain('/api/v1/mail-links/unsubscribe?t=');
  });

  it('recovery mails back-online once, with the outage’s duration, to the same people', async () => {
    const s = await alertScene(ctx);
    await s.report();
    clock.advance(OFFLINE_AFTER_S);
    await silenceCheck(ctx);
    await sendOutbox(ctx);
    await clearInbox();
    clock.advance(20 * 60);
    expect((await s.report()).status).toBe(202);
    expect((await Node.findByPk(s.node.id))!.state).toBe('online');
    await sendOutbox(ctx);
    await sendOutbox(ctx);
    const mail = await mailTo(s.addresses(...s.everyone));
    expect(mail.map((m) => m.to[0].address).sort()).toEqual([s.host.email, s.operator.email].sort());
    const opMail = mail.find((m) => m.to[0].address === s.operator.email)!;
    // Outage from the first missed report (60 s after the last one) to the report 20 min after going offline.
    expect(opMail.subject).toMatch(/^Back online: .* after 22 min$/);
    expect(mail.find((m) => m.to[0].address === s.host.email)!.text).toContain('out for 22 min');
  });

  it('follows preferences: an opted-in admin gets it, an operator who chose off does not, an hourly one reads it in the digest', async () => {
    const s = await alertScene(ctx);
    const hourly = await buildUser({ role: 'operator' });
    const { OperatorAssignment } = await import('../../server/models');
    await OperatorAssignment.create({ userId: hourly.id, neighbourhoodId: s.hood.id });
    await setPreferences(s.admin.id, { adminNodeMail: true });
    await setPreferences(s.operator.id, { operatorMode: 'off' });
    await setPreferences(hourly.id, { operatorMode: 'hourly' });
    await runAlertSweep(ctx.sequelize, ctx.config, clock.now()); // marks the hour the digest counts from
    await s.report();
    clock.advance(OFFLINE_AFTER_S);
    await silenceCheck(ctx);
    await sendOutbox(ctx);
    let mail = await mailTo(s.addresses(...s.everyone, hourly));
    expect(mail.map((m) => m.to[0].address).sort()).toEqual([s.admin.email, s.host.email].sort());
    clock.set(clock.now().toISOString().slice(0, 13) + ':00:00Z');
    clock.advance(3600);
    await runAlertSweep(ctx.sequelize, ctx.config, clock.now());
    await sendOutbox(ctx);
    mail = await mailTo([hourly.email]);
    expect(mail).toHaveLength(1);
    expect(mail[0].subject).toBe('Hourly digest: 1 node change');
    expect(mail[0].text).toContain(`${s.node.name} (`);
  });

  it('holds a host’s mail until their quiet hours end (network time zone)', async () => {
    const s = await alertScene(ctx);
    await ctx.sequelize.query(`UPDATE network_settings SET time_zone = 'Europe/Berlin'`);
    try {
      // 12:00 UTC is 14:00 in Berlin in July (CEST, UTC+2): quiet from 13:30 to 15:00 local.
      await setPreferences(s.host.id, { quietStart: '13:30', quietEnd: '15:00' });
      await s.report();
      clock.advance(OFFLINE_AFTER_S);
      await silenceCheck(ctx);
      const hostRow = (await outboxRows(ctx, s.node.id)).find((r) => r.recipient_user_id === s.host.id)!;
      expect(new Date(hostRow.next_attempt_at).toISOString()).toBe(clock.now().toISOString().slice(0, 11) + '13:00:00.000Z');
      await sendOutbox(ctx);
      expect((await mailTo([s.host.email])).length).toBe(0);
      expect((await mailTo([s.operator.email])).length).toBe(1);
      clock.set(clock.now().toISOString().slice(0, 11) + '13:00:00Z');
      await sendOutbox(ctx);
      expect((await mailTo([s.host.email])).length).toBe(1);
    } finally {
      await ctx.sequelize.query(`UPDATE network_settings SET time_zone = 'UTC'`);
    }
  });

  it('waits for a longer grace before the first mail, and mails nothing when the node is back within it', async () => {
    ctx.config.alertGraceS = 600;
    const s = await alertScene(ctx);
    await s.report();
    clock.advance(OFFLINE_AFTER_S);
    await silenceCheck(ctx);
    await runAlertSweep(ctx.sequelize, ctx.config, clock.now());
    expect(await outboxRows(ctx, s.node.id)).toHaveLength(0);
    clock.advance(600 - OFFLINE_AFTER_S);
    await runAlertSweep(ctx.sequelize, ctx.config, clock.now());
    const rows = (await outboxRows(ctx, s.node.id)).filter((r) => [s.host.id, s.operator.id].includes(r.recipient_user_id));
    expect(rows.map((r) => r.kind)).toEqual(['node-offline', 'node-offline']);

    const quick = await alertScene(ctx);
    await quick.report();
    clock.advance(OFFLINE_AFTER_S);
    await silenceCheck(ctx);
    clock.advance(60);
    await quick.report();
    clock.advance(600);
    await runAlertSweep(ctx.sequelize, ctx.config, clock.now());
    expect(await outboxRows(ctx, quick.node.id)).toHaveLength(0);
  });

  it('caps a flapping node’s mail per hour and sends one summary instead of the rest', async () => {
    const s = await alertScene(ctx);
    for (let i = 0; i < 6; i++) {
      await s.report();
      clock.advance(OFFLINE_AFTER_S);
      await silenceCheck(ctx);
      await sendOutbox(ctx); // the sender runs every tick
      clock.advance(5);
    }
    await s.report();
    await sendOutbox(ctx);
    const toOperator = await mailTo([s.operator.email]);
    expect(toOperator.length).toBeLessThanOrEqual(ctx.config.flapMaxPerHour + 1);
    expect(toOperator.filter((m) => m.subject.startsWith('Unsteady:'))).toHaveLength(1);
    expect((await mailTo([s.host.email])).filter((m) => m.subject.startsWith('Unsteady:'))).toHaveLength(1);
    // An hour later the node is mailed about normally again.
    clock.advance(3700);
    await s.report();
    clock.advance(OFFLINE_AFTER_S);
    await silenceCheck(ctx);
    await sendOutbox(ctx);
    expect((await mailTo([s.operator.email])).filter((m) => m.subject.startsWith('Offline:')).length).toBe(ctx.config.flapMaxPerHour / 2 + 1);
  });

  it('reminds the operators (not the host) while unacknowledged; acknowledging stops the reminders', async () => {
    const s = await alertScene(ctx);
    await s.report();
    clock.advance(OFFLINE_AFTER_S);
    await silenceCheck(ctx);
    clock.advance(ctx.config.reminderIntervalS - 1);
    await runAlertSweep(ctx.sequelize, ctx.config, clock.now());
    expect((await outboxRows(ctx, s.node.id)).filter((r) => r.kind === 'node-reminder')).toHaveLength(0);
    clock.advance(1);
    await runAlertSweep(ctx.sequelize, ctx.config, clock.now());
    await sendOutbox(ctx);
    const reminders = (await mailTo(s.addresses(...s.everyone))).filter((m) => m.subject.startsWith('Still offline:'));
    expect(reminders.map((m) => m.to[0].address)).toEqual([s.operator.email]);

    const outage = (await Outage.findOne({ where: { nodeId: s.node.id, endedAt: null } }))!;
    expect((await call(await signIn(ctx, s.operator), 'post', `/api/v1/outages/${outage.id}/acknowledge`)).status).toBe(200);
    for (let i = 0; i < 3; i++) {
      clock.advance(ctx.config.reminderIntervalS);
      await runAlertSweep(ctx.sequelize, ctx.config, clock.now());
    }
    expect((await outboxRows(ctx, s.node.id)).filter((r) => r.kind === 'node-reminder')).toHaveLength(1);
  });

  it('sends one self-check to each admin when the health check had stopped, not one per node', async () => {
    const s = await alertScene(ctx);
    const secondAdmin = await buildUser({ role: 'admin' });
    await buildNode({ neighbourhoodId: s.hood.id });
    await s.report();
    clock.advance(2 * 3600); // Parapet was down: no checks ran
    const run = await runSilenceCheck(ctx.sequelize, ctx.config, clock.now(), 1000);
    expect(run.resumed).toBe(true);
    await sendOutbox(ctx);
    const mail = await mailTo(s.addresses(...s.everyone, secondAdmin));
    expect(mail.map((m) => m.to[0].address).sort()).toEqual([s.admin.email, secondAdmin.email].sort());
    expect(mail[0].subject).toBe('Parapet’s health check was not running for 2 h'.replace('’', "'"));
    const [{ n }] = await ctx.sequelize.query<{ n: string }>(`SELECT count(*) AS n FROM outbox WHERE kind = 'self-check' AND recipient_user_id = $1`, {
      bind: [s.admin.id],
      type: QueryTypes.SELECT,
    });
    expect(Number(n)).toBe(1);
  });

  it('sends operators a daily digest of nodes degraded for hours, not an alarm', async () => {
    const s = await alertScene(ctx);
    await Node.update(
      { state: 'degraded', stateSince: new Date(clock.now().getTime() - 5 * 3600_000), healthReason: 'SNR 9 dB below 15 dB' },
      { where: { id: s.node.id } },
    );
    clock.set(clock.now().toISOString().slice(0, 11) + '07:30:00Z');
    clock.advance(86_400); // the next morning, before the digest hour (08:00 UTC)
    await runAlertSweep(ctx.sequelize, ctx.config, clock.now());
    expect(await mailTo([s.operator.email])).toHaveLength(0);
    clock.advance(3600);
    await runAlertSweep(ctx.sequelize, ctx.config, clock.now());
    await runAlertSweep(ctx.sequelize, ctx.config, clock.now());
    await sendOutbox(ctx);
    const mail = await mailTo(s.addresses(...s.everyone));
    expect(mail.map((m) => m.to[0].address)).toEqual([s.operator.email]);
    expect(mail[0].subject).toMatch(/^Daily digest: \d+ nodes? degraded for hours$/);
    expect(mail[0].text).toContain(`${s.node.name} (`);
    expect(mail[0].text).toContain('SNR 9 dB below 15 dB');
  });
});
