import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { beforeEach, describe, expect, it } from 'vitest';
import { runAlertSweep } from '../../server/jobs/alertSweep';
import { AlertPreference, Node, OperatorAssignment, Outage, Site, User } from '../../server/models';
import { buildUser, useApi, type TestContext } from '../helpers/api';
import { alertScene, outboxRows, sendOutbox, silenceCheck } from '../helpers/alertScene';
import { manualClock } from '../helpers/clock';
import { clearInbox, type FakeMail, mailTo, rawHeaders } from '../helpers/mailFake';

const clock = manualClock();
let day = 1;

/** A path with query from a link in the mail's plain-text part. */
function linkIn(mail: FakeMail, purpose: string) {
  const m = new RegExp(`https?://[^\\s]+(/api/v1/mail-links/${purpose}\\?t=[^\\s]+)`).exec(mail.text);
  if (!m) throw new Error(`no ${purpose} link in "${mail.subject}"`);
  return m[1];
}

async function offlineScene(ctx: TestContext, opts: Parameters<typeof alertScene>[1] = {}) {
  const s = await alertScene(ctx, opts);
  await s.report();
  clock.advance(181);
  await silenceCheck(ctx);
  await sendOutbox(ctx);
  return s;
}

describe('links in outage mail', () => {
  const ctx = useApi({ now: clock.now });
  beforeEach(async () => {
    clock.set(`2026-08-${String(day++).padStart(2, '0')}T12:00:00Z`);
    await clearInbox();
    await silenceCheck(ctx);
  });

  it('one-click unsubscribe works signed out (RFC 8058 headers and POST); opening the link alone changes nothing', async () => {
    const s = await offlineScene(ctx);
    const [hostMail] = await mailTo([s.host.email]);
    const source = await rawHeaders(hostMail.id);
    const header = /^List-Unsubscribe: <([^>]+)>/m.exec(source);
    expect(header).not.toBeNull();
    expect(source).toMatch(/^List-Unsubscribe-Post: List-Unsubscribe=One-Click/m);
    const path = new URL(header![1]).pathname + new URL(header![1]).search;

    const page = await request(ctx.app).get(path);
    expect(page.status).toBe(200);
    expect(page.text).toContain('<form method="post"');
    expect(await AlertPreference.findByPk(s.host.id)).toBeNull();

    const res = await request(ctx.app).post(path).type('form').send('List-Unsubscribe=One-Click');
    expect(res.status).toBe(200);
    expect(res.text).toContain('no more mail');
    expect((await AlertPreference.findByPk(s.host.id))!.hostMail).toBe(false);

    // The node recovers and drops again: the unsubscribed host hears nothing more, the operator does.
    await clearInbox();
    clock.advance(60);
    await s.report();
    clock.advance(181);
    await silenceCheck(ctx);
    await sendOutbox(ctx);
    expect(await mailTo([s.host.email])).toHaveLength(0);
    expect((await mailTo([s.operator.email])).length).toBeGreaterThan(0);
  });

  it('refuses a tampered link with 400, another purpose’s link with 400, and an expired one with 410', async () => {
    const s = await offlineScene(ctx);
    const [opMail] = await mailTo([s.operator.email]);
    const unsubscribe = linkIn(opMail, 'unsubscribe');
    const otherUser = unsubscribe.replace(/unsubscribe\.(\d+)\./, (_m, id) => `unsubscribe.${Number(id) + 1}.`);
    const res = await request(ctx.app).post(otherUser).type('form').send('List-Unsubscribe=One-Click');
    expect(res.status).toBe(400);
    expect(res.text).toContain('damaged or was changed');
    const flipped = unsubscribe.slice(0, -1) + (unsubscribe.endsWith('A') ? 'B' : 'A');
    expect((await request(ctx.app).post(flipped)).status).toBe(400);
    expect((await request(ctx.app).get('/api/v1/mail-links/unsubscribe?t=garbage')).status).toBe(400);
    expect((await request(ctx.app).get('/api/v1/mail-links/unsubscribe')).status).toBe(400);
    const asAck = linkIn(opMail, 'unsubscribe').replace('/unsubscribe?', '/acknowledge?');
    expect((await request(ctx.app).get(asAck)).status).toBe(400);
    expect(await AlertPreference.findByPk(s.operator.id)).toBeNull();

    clock.advance(ctx.config.mailLinkDays * 86_400 + 1);
    const expired = await request(ctx.app).post(unsubscribe);
    expect(expired.status).toBe(410);
    expect(expired.text).toContain('expired');
    expect(await AlertPreference.findByPk(s.operator.id)).toBeNull();
  });

  it('acknowledges through the signed link: GET only shows a confirm page, POST acknowledges and stops reminders', async () => {
    const s = await offlineScene(ctx);
    const [opMail] = await mailTo([s.operator.email]);
    const ack = linkIn(opMail, 'acknowledge');
    const outage = (await Outage.findOne({ where: { nodeId: s.node.id, endedAt: null } }))!;

    const confirm = await request(ctx.app).get(ack);
    expect(confirm.status).toBe(200);
    expect(confirm.text).toContain('Acknowledge outage');
    expect((await outage.reload()).acknowledgedAt).toBeNull();

    const done = await request(ctx.app)
      .post('/api/v1/mail-links/acknowledge')
      .type('form')
      .send({ t: new URL(`http://x${ack}`).searchParams.get('t') });
    expect(done.status).toBe(200);
    await outage.reload();
    expect(outage.acknowledgedBy).toBe(s.operator.id);
    expect(outage.acknowledgedAt!.toISOString()).toBe(clock.now().toISOString());
    clock.advance(ctx.config.reminderIntervalS * 2);
    await runAlertSweep(ctx.sequelize, ctx.config, clock.now());
    expect((await outboxRows(ctx, s.node.id)).filter((r) => r.kind === 'node-reminder')).toHaveLength(0);
  });

  it('refuses the acknowledge link of an operator no longer assigned to the neighbourhood (403)', async () => {
    const s = await offlineScene(ctx);
    const [opMail] = await mailTo([s.operator.email]);
    await OperatorAssignment.destroy({ where: { userId: s.operator.id } });
    const res = await request(ctx.app).post(linkIn(opMail, 'acknowledge'));
    expect(res.status).toBe(403);
    expect(res.text).toContain('no longer an operator');
  });

  it('changes preferences through the signed link without signing in', async () => {
    const s = await offlineScene(ctx);
    const [opMail] = await mailTo([s.operator.email]);
    const prefs = linkIn(opMail, 'preferences');
    const form = await request(ctx.app).get(prefs);
    expect(form.status).toBe(200);
    expect(form.text).toContain('value="hourly"');
    const t = new URL(`http://x${prefs}`).searchParams.get('t');
    const saved = await request(ctx.app).post('/api/v1/mail-links/preferences').type('form').send({ t, operatorMode: 'hourly' });
    expect(saved.status).toBe(200);
    expect((await AlertPreference.findByPk(s.operator.id))!.operatorMode).toBe('hourly');
    const bad = await request(ctx.app).post('/api/v1/mail-links/preferences').type('form').send({ t, operatorMode: 'sometimes' });
    expect(bad.status).toBe(400);
    expect(bad.text).toContain('operatorMode must be immediate, hourly or off');
  });

  it('strips CR/LF from names in headers: no injected header, no extra recipient', async () => {
    const s = await alertScene(ctx, { nodeName: `relay-${day}\r\nBcc: intruder@evil.test`, hostName: 'Eve\r\nBcc: intruder@evil.test' });
    const sneaky = await buildUser({ role: 'operator' });
    await User.update({ email: `sneaky-${day}@example.test\r\nbcc: intruder@evil.test` }, { where: { id: sneaky.id } });
    await OperatorAssignment.create({ userId: sneaky.id, neighbourhoodId: s.hood.id });
    await s.report();
    clock.advance(181);
    await silenceCheck(ctx);
    await sendOutbox(ctx);
    expect(await mailTo(['intruder@evil.test'])).toHaveLength(0);
    const mail = await mailTo([s.host.email, s.operator.email]);
    expect(mail).toHaveLength(2);
    for (const m of mail) {
      const headers = await rawHeaders(m.id);
      expect(headers).not.toMatch(/^Bcc:/im);
      expect(headers.split(/\r?\n/).filter((l) => /^To:/i.test(l))).toHaveLength(1);
      expect(m.subject).not.toMatch(/[\r\n]/);
      expect(m.subject).toContain('Bcc: intruder@evil.test'); // kept as harmless text on one line
    }
    // The address with a line break is refused outright: nothing is written for it.
    const [{ n }] = await ctx.sequelize.query<{ n: string }>('SELECT count(*) AS n FROM outbox WHERE recipient_user_id = $1', {
      bind: [sneaky.id],
      type: QueryTypes.SELECT,
    });
    expect(Number(n)).toBe(0);
  });

  it('escapes names from the database in the HTML part', async () => {
    const s = await alertScene(ctx, { nodeName: `<script>alert(${day})</script>`, siteName: '<img src=x onerror=alert(1)>', hostName: '<b>Mallory</b>' });
    await Site.update({ accessNotes: '<script>steal()</script>' }, { where: { id: s.site.id } });
    await s.report();
    clock.advance(181);
    await silenceCheck(ctx);
    await sendOutbox(ctx);
    const mail = await mailTo([s.host.email, s.operator.email]);
    expect(mail).toHaveLength(2);
    for (const m of mail) {
      expect(m.html).not.toMatch(/<script|<img|<b>Mallory/i);
      expect(m.html).toContain('&lt;script&gt;alert(');
    }
    expect(mail.find((m) => m.to[0].address === s.host.email)!.html).toContain('&lt;img src=x onerror=alert(1)&gt;');
    expect((await Node.findByPk(s.node.id))!.state).toBe('offline');
  });
});
