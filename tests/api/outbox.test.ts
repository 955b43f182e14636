import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { beforeEach, describe, expect, it } from 'vitest';
import { deliverDue, runOutboxSender } from '../../server/jobs/outboxSender';
import { createSequelize } from '../../server/db/sequelize';
import { messageIdFor } from '../../server/mail/transport';
import { buildUser, call, signIn, useApi } from '../helpers/api';
import { alertScene, outboxRows, sendOutbox, silenceCheck } from '../helpers/alertScene';
import { manualClock } from '../helpers/clock';
import { clearInbox, freePort, mailTo, rawHeaders, startMaildev } from '../helpers/mailFake';

const clock = manualClock();
let day = 1;

describe('outbox delivery', () => {
  const ctx = useApi({ now: clock.now });
  const smtpPort = () => Number(process.env.SMTP_PORT);
  beforeEach(async () => {
    clock.set(`2026-09-${String(day++).padStart(2, '0')}T12:00:00Z`);
    ctx.config.smtpPort = smtpPort();
    ctx.config.outboxMaxAttempts = 6;
    await clearInbox();
    await silenceCheck(ctx);
  });

  async function outageWithMail() {
    const s = await alertScene(ctx);
    await s.report();
    clock.advance(181);
    await silenceCheck(ctx);
    return s;
  }

  it('keeps mail while the SMTP server is down and delivers it once when it is back', async () => {
    const s = await outageWithMail();
    const deadPort = await freePort();
    const webPort = await freePort();
    ctx.config.smtpPort = deadPort;
    const first = await sendOutbox(ctx);
    expect(first.sent).toBe(0);
    expect(first.retrying).toBeGreaterThanOrEqual(2);
    const rows = await outboxRows(ctx, s.node.id);
    expect(rows.every((r) => r.status === 'pending' && r.attempts === 1 && /ECONNREFUSED|connect/i.test(r.last_error ?? ''))).toBe(true);
    // Backoff: not retried before the base interval has passed.
    expect(rows.every((r) => new Date(r.next_attempt_at).getTime() === clock.now().getTime() + ctx.config.outboxBackoffBaseMs)).toBe(true);
    expect((await sendOutbox(ctx)).sent).toBe(0);

    const fake = await startMaildev(deadPort, webPort);
    try {
      clock.advance(ctx.config.outboxBackoffBaseMs / 1000);
      const second = await sendOutbox(ctx);
      expect(second.sent).toBe(2);
      await sendOutbox(ctx);
      clock.advance(3600);
      await sendOutbox(ctx);
      const mail = await mailTo(s.addresses(...s.everyone), fake.base);
      expect(mail.map((m) => m.to[0].address).sort()).toEqual([s.host.email, s.operator.email].sort());
      const sent = await outboxRows(ctx, s.node.id);
      expect(sent.every((r) => r.status === 'sent' && r.attempts === 2)).toBe(true);
      // The Message-ID comes from the dedupe key, so even a repeat would be recognisable.
      const headers = await rawHeaders(mail[0].id, fake.base);
      const row = sent.find((r) => r.recipient_user_id === (mail[0].to[0].address === s.host.email ? s.host.id : s.operator.id))!;
      expect(headers).toContain(`Message-ID: ${messageIdFor(row.dedupe_key, ctx.config)}`);
    } finally {
      await fake.stop();
    }
  });

  it('retries outage mail on a short ceiling, gives it up only after a day, and an admin can retry it', async () => {
    const s = await outageWithMail();
    ctx.config.smtpPort = await freePort();
    ctx.config.outboxMaxAttempts = 3;
    const op = () => outboxRows(ctx, s.node.id).then((rows) => rows.find((r) => r.recipient_user_id === s.operator.id)!);
    const gapsS: number[] = [];
    for (let i = 0; i < 4; i++) {
      const before = clock.now().getTime();
      await sendOutbox(ctx);
      const row = await op();
      if (row.status === 'pending') gapsS.push((new Date(row.next_attempt_at).getTime() - before) / 1000);
      clock.set(new Date(row.next_attempt_at).toISOString());
    }
    // 30 s, then capped at OUTAGE_MAIL_RETRY_MAX_MS (30 s) instead of doubling; still pending past the attempt limit.
    expect(ctx.config.outageMailRetryMaxMs).toBe(30_000);
    expect(gapsS).toEqual([30, 30, 30, 30]);
    expect((await op()).status).toBe('pending');
    clock.advance(24 * 3600);
    await sendOutbox(ctx);
    const failed = await op();
    expect(failed.status).toBe('failed');
    expect(failed.attempts).toBe(5);

    const admin = await signIn(ctx, s.admin);
    const list = await call(admin, 'get', '/api/v1/outbox?status=failed&kind=node-offline');
    expect(list.status).toBe(200);
    const item = list.body.data.find((m: { id: number }) => m.id === Number(failed.id));
    expect(item).toMatchObject({
      kind: 'node-offline',
      status: 'failed',
      attempts: 5,
      recipient: { userId: s.operator.id, address: s.operator.email },
      abilities: { retry: true },
    });
    expect(item.subject).toMatch(/^Offline: /);
    expect(typeof item.createdAt).toBe('string');
    expect(item.sentAt).toBeNull();

    const retried = await call(admin, 'post', `/api/v1/outbox/${failed.id}/retry`);
    expect(retried.status).toBe(200);
    expect(retried.body.data).toMatchObject({ status: 'pending', attempts: 0 });
    expect((await call(admin, 'post', `/api/v1/outbox/${failed.id}/retry`)).status).toBe(409);
    ctx.config.smtpPort = smtpPort();
    await sendOutbox(ctx);
    expect((await op()).status).toBe('sent');
    expect(await mailTo([s.operator.email])).toHaveLength(1);
    // The host's copy (quiet hours, still inside its day of retries) would otherwise reach later tests.
    await ctx.sequelize.query(`DELETE FROM outbox WHERE node_id = $1 AND status = 'pending'`, { bind: [s.node.id] });
  });

  it('lets other mail back off longer: doubling from 30 s, failed after the attempt limit', async () => {
    ctx.config.smtpPort = await freePort();
    ctx.config.outboxMaxAttempts = 3;
    const key = `other-mail:${clock.now().toISOString()}`;
    await ctx.sequelize.query(
      `INSERT INTO outbox (kind, recipient_address, recipient_name, subject, text_body, html_body, dedupe_key, next_attempt_at, created_at, updated_at)
       VALUES ('invitation', 'someone@example.test', 'Someone', 'Invitation', 'text', '<p>text</p>', $1, $2, $2, $2)`,
      { bind: [key, clock.now()] },
    );
    const row = async () =>
      (
        await ctx.sequelize.query<{ status: string; attempts: number; next_attempt_at: Date }>(
          'SELECT status, attempts, next_attempt_at FROM outbox WHERE dedupe_key = $1',
          { bind: [key], type: QueryTypes.SELECT },
        )
      )[0];
    const gapsS: number[] = [];
    for (let i = 0; i < 3; i++) {
      const before = clock.now().getTime();
      await sendOutbox(ctx);
      const r = await row();
      if (r.status === 'pending') gapsS.push((new Date(r.next_attempt_at).getTime() - before) / 1000);
      clock.set(new Date(r.next_attempt_at).toISOString());
    }
    expect(gapsS).toEqual([30, 60]);
    expect(await row()).toMatchObject({ status: 'failed', attempts: 3 });
  });

  it('turns an outage mail still failing when the node is back into one "was down from … to …" mail', async () => {
    const s = await outageWithMail();
    ctx.config.smtpPort = await freePort();
    await sendOutbox(ctx); // tried once, SMTP unreachable: still pending
    const [tried] = (await outboxRows(ctx, s.node.id)).filter((r) => r.recipient_user_id === s.operator.id);
    expect(tried).toMatchObject({ kind: 'node-offline', status: 'pending', attempts: 1 });
    clock.advance(300);
    expect((await s.report()).status).toBe(202); // back online
    const rows = (await outboxRows(ctx, s.node.id)).filter((r) => r.recipient_user_id === s.operator.id);
    expect(rows.map((r) => r.kind)).toEqual(['node-online']);
    ctx.config.smtpPort = smtpPort();
    clock.advance(60);
    await sendOutbox(ctx);
    const mail = await mailTo([s.operator.email]);
    expect(mail).toHaveLength(1);
    expect(mail[0].text).toMatch(/was\s+down\s+from\s[\s\S]+\sto\s[\s\S]+\(/);
    expect(mail[0].text).toMatch(/could\s+not\s+be\s+delivered/);
    // The node is back and would go silent again in the next test's day: take it (and its pending mail) away.
    await ctx.sequelize.query(`DELETE FROM outbox WHERE node_id = $1 AND status = 'pending'`, { bind: [s.node.id] });
    await s.node.destroy();
  });

  it('two server processes on one database send each message once', async () => {
    const scenes = [await outageWithMail(), await outageWithMail(), await outageWithMail()];
    const other = createSequelize(ctx.config.databaseUrl, 4);
    try {
      // Both through the leader lock, and both straight at the claim (SKIP LOCKED) with no leader at all.
      const runs = await Promise.all([runOutboxSender(ctx.sequelize, ctx.config), runOutboxSender(other, ctx.config)]);
      expect(runs.filter((r) => r.leader).length).toBeGreaterThanOrEqual(1);
      const more = await Promise.all([deliverDue(ctx.sequelize, ctx.config), deliverDue(other, ctx.config), deliverDue(other, ctx.config)]);
      expect(runs.reduce((n, r) => n + r.sent, 0) + more.reduce((n, r) => n + r.sent, 0)).toBe(6);
    } finally {
      await other.close();
    }
    const addresses = scenes.flatMap((s) => s.addresses(s.host, s.operator));
    const mail = await mailTo(addresses);
    expect(mail).toHaveLength(6);
    expect(new Set(mail.map((m) => m.to[0].address)).size).toBe(6);
  });
});

describe('outbox, inbox and preference routes', () => {
  const ctx = useApi({ now: clock.now });

  it('GET /outbox: 401 signed out, 403 for operators and hosts, 400 for a bad filter, 200 with the list envelope for admins', async () => {
    expect((await request(ctx.app).get('/api/v1/outbox')).status).toBe(401);
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    const host = await signIn(ctx, await buildUser({ role: 'host' }));
    const forbidden = await call(op, 'get', '/api/v1/outbox');
    expect(forbidden.status).toBe(403);
    expect(forbidden.body.error.message).toContain('Only admins see the outbox');
    expect((await call(host, 'get', '/api/v1/outbox')).status).toBe(403);
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    const bad = await call(admin, 'get', '/api/v1/outbox?status=lost');
    expect(bad.status).toBe(400);
    expect(bad.body.error.details[0]).toEqual({ path: 'status', message: 'status must be one of pending, sent, failed' });
    expect((await call(admin, 'get', '/api/v1/outbox?kind=fax')).status).toBe(400);
    expect((await call(admin, 'get', '/api/v1/outbox?sort=textBody')).status).toBe(400);
    const ok = await call(admin, 'get', '/api/v1/outbox?pageSize=5');
    expect(ok.status).toBe(200);
    expect(ok.body.pagination).toMatchObject({ page: 1, pageSize: 5 });
    expect(Array.isArray(ok.body.data)).toBe(true);
  });

  it('POST /outbox/:id/retry: 401, 403, 400 for a bad id, 404 for a missing one', async () => {
    expect((await request(ctx.app).post('/api/v1/outbox/1/retry')).status).toBe(401);
    const op = await signIn(ctx, await buildUser({ role: 'operator' }));
    expect((await call(op, 'post', '/api/v1/outbox/1/retry')).status).toBe(403);
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    expect((await call(admin, 'post', '/api/v1/outbox/abc/retry')).status).toBe(400);
    const missing = await call(admin, 'post', '/api/v1/outbox/999999/retry');
    expect(missing.status).toBe(404);
    expect(missing.body.error.message).toBe('Outbox message 999999 was not found.');
  });

  it('GET /mail-inbox: admins only, and only outside production', async () => {
    expect((await request(ctx.app).get('/api/v1/mail-inbox')).status).toBe(401);
    expect((await call(await signIn(ctx, await buildUser({ role: 'operator' })), 'get', '/api/v1/mail-inbox')).status).toBe(403);
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    const saved = { env: ctx.config.env, url: ctx.config.maildevWebUrl };
    try {
      ctx.config.maildevWebUrl = 'http://127.0.0.1:1080';
      expect((await call(admin, 'get', '/api/v1/mail-inbox')).body).toEqual({ data: { url: 'http://127.0.0.1:1080' } });
      ctx.config.env = 'production';
      expect((await call(admin, 'get', '/api/v1/mail-inbox')).status).toBe(404);
    } finally {
      ctx.config.env = saved.env;
      ctx.config.maildevWebUrl = saved.url;
    }
  });

  it('GET/PATCH /me/preferences: 401 signed out, 400 with the field, 200 saves one’s own', async () => {
    expect((await request(ctx.app).get('/api/v1/me/preferences')).status).toBe(401);
    expect((await request(ctx.app).patch('/api/v1/me/preferences').send({ operatorMode: 'off' })).status).toBe(401);
    const agent = await signIn(ctx, await buildUser({ role: 'operator' }));
    const initial = await call(agent, 'get', '/api/v1/me/preferences');
    expect(initial.body.data).toMatchObject({
      operatorMode: 'immediate',
      hostMail: true,
      quietStart: null,
      applies: { operator: true, host: false, admin: false },
    });
    const cases: [object, string, string][] = [
      [{ operatorMode: 'sometimes' }, 'operatorMode', 'operatorMode must be immediate, hourly or off'],
      [{ quietStart: '22:00' }, 'quietEnd', 'quietEnd quiet hours need both a start and an end (or both cleared)'],
      [{ quietStart: '25:00', quietEnd: '07:00' }, 'quietStart', 'quietStart must be a time like 22:00 (24-hour clock)'],
      [{ hostMail: 'yes' }, 'hostMail', 'hostMail must be true or false'],
    ];
    for (const [body, path, message] of cases) {
      const res = await call(agent, 'patch', '/api/v1/me/preferences', body);
      expect(res.status).toBe(400);
      expect(res.body.error.details[0]).toEqual({ path, message });
    }
    expect((await call(agent, 'patch', '/api/v1/me/preferences', { role: 'admin' })).status).toBe(400);
    const saved = await call(agent, 'patch', '/api/v1/me/preferences', { operatorMode: 'hourly', quietStart: '22:00', quietEnd: '07:00' });
    expect(saved.status).toBe(200);
    expect(saved.body.data).toMatchObject({ operatorMode: 'hourly', quietStart: '22:00', quietEnd: '07:00' });
    expect((await call(agent, 'get', '/api/v1/me/preferences')).body.data.operatorMode).toBe('hourly');
  });
});

describe('maintenance windows', () => {
  const ctx = useApi({ now: clock.now });
  beforeEach(async () => {
    clock.set(`2026-10-${String(day++).padStart(2, '0')}T12:00:00Z`);
    await clearInbox();
    await silenceCheck(ctx);
  });
  const at = (s: number) => new Date(clock.now().getTime() + s * 1000).toISOString();

  it('silences a node inside its window: state maintenance, no outage, no mail; afterwards it returns by its reports', async () => {
    const s = await alertScene(ctx);
    await s.report();
    const host = await signIn(ctx, s.host);
    const created = await call(host, 'post', `/api/v1/nodes/${s.node.id}/maintenance-windows`, {
      startsAt: at(-1),
      endsAt: at(3600),
      reason: 'New roof membrane',
    });
    expect(created.status).toBe(201);
    expect(created.body.data).toMatchObject({ status: 'active', reason: 'New roof membrane', createdBy: { id: s.host.id }, abilities: { cancel: true } });
    expect((await call(host, 'get', `/api/v1/nodes/${s.node.id}`)).body.data.state).toBe('maintenance');
    for (let i = 0; i < 10; i++) {
      clock.advance(300);
      await silenceCheck(ctx);
    }
    clock.advance(600); // the window is over; the node never reported during it
    await silenceCheck(ctx);
    const outages = await ctx.sequelize.query<{ started_at: Date }>('SELECT started_at FROM outages WHERE node_id = $1', {
      bind: [s.node.id],
      type: QueryTypes.SELECT,
    });
    expect(outages).toHaveLength(1);
    expect(new Date(outages[0].started_at).toISOString()).toBe(created.body.data.endsAt);
    // Only the mail for after the window: nothing during it.
    const rows = await outboxRows(ctx, s.node.id);
    expect(rows.every((r) => r.kind === 'node-offline')).toBe(true);
    expect(Math.min(...rows.map((r) => clock.now().getTime() - new Date(r.next_attempt_at).getTime()))).toBe(0);

    const quiet = await alertScene(ctx);
    await quiet.report();
    const op = await signIn(ctx, quiet.operator);
    expect((await call(op, 'post', `/api/v1/nodes/${quiet.node.id}/maintenance-windows`, { startsAt: at(0), endsAt: at(900) })).status).toBe(201);
    clock.advance(850);
    await quiet.report(); // reports near the end of the window, so it is fresh when the window closes
    clock.advance(51);
    await silenceCheck(ctx);
    await sendOutbox(ctx);
    expect((await call(op, 'get', `/api/v1/nodes/${quiet.node.id}`)).body.data.state).toBe('online');
    expect(await outboxRows(ctx, quiet.node.id)).toHaveLength(0);
    expect(await mailTo(quiet.addresses(...quiet.everyone))).toHaveLength(0);
  });

  it('cancelling a window ends maintenance at once', async () => {
    const s = await alertScene(ctx);
    await s.report();
    const op = await signIn(ctx, s.operator);
    const w = await call(op, 'post', `/api/v1/nodes/${s.node.id}/maintenance-windows`, { startsAt: at(0), endsAt: at(3600) });
    const del = await call(op, 'delete', `/api/v1/nodes/${s.node.id}/maintenance-windows/${w.body.data.id}`);
    expect(del.status).toBe(204);
    expect((await call(op, 'get', `/api/v1/nodes/${s.node.id}`)).body.data.state).toBe('online');
    const list = await call(op, 'get', `/api/v1/nodes/${s.node.id}/maintenance-windows`);
    expect(list.body.data[0]).toMatchObject({ status: 'cancelled', abilities: { cancel: false } });
  });

  it('RBAC and validation: 401, 404 for people who cannot read the node, 400 with the field', async () => {
    const s = await alertScene(ctx);
    const url = `/api/v1/nodes/${s.node.id}/maintenance-windows`;
    const body = { startsAt: at(0), endsAt: at(600) };
    expect((await request(ctx.app).get(url)).status).toBe(401);
    expect((await request(ctx.app).post(url).send(body)).status).toBe(401);
    for (const outsider of [s.otherOperator, s.otherHost]) {
      const agent = await signIn(ctx, outsider);
      expect((await call(agent, 'get', url)).status).toBe(404);
      expect((await call(agent, 'post', url, body)).status).toBe(404);
    }
    const admin = await signIn(ctx, s.admin);
    const cases: [object, string, string][] = [
      [{ startsAt: at(600), endsAt: at(0) }, 'endsAt', 'endsAt must be after startsAt'],
      [{ startsAt: 'tomorrow', endsAt: at(600) }, 'startsAt', 'startsAt must be a date and time like 2026-06-01T09:00:00Z'],
      [{ startsAt: at(-7200), endsAt: at(-3600) }, 'endsAt', 'endsAt must be in the future'],
      [{ startsAt: at(0), endsAt: at(15 * 86400) }, 'endsAt', 'endsAt a maintenance window may last at most 14 days'],
      [{ ...body, reason: 'x'.repeat(501) }, 'reason', 'reason must be at most 500 characters'],
    ];
    for (const [b, path, message] of cases) {
      const res = await call(admin, 'post', url, b);
      expect(res.status).toBe(400);
      expect(res.body.error.details[0]).toEqual({ path, message });
    }
    expect((await call(admin, 'post', '/api/v1/nodes/abc/maintenance-windows', body)).status).toBe(400);
    expect((await call(admin, 'delete', `${url}/999999`)).status).toBe(404);
    const mine = await call(admin, 'post', url, body);
    expect(mine.status).toBe(201);
    const otherNode = (await call(admin, 'get', '/api/v1/nodes?pageSize=500')).body.data.find((n: { id: number }) => n.id !== s.node.id).id;
    expect((await call(admin, 'delete', `/api/v1/nodes/${otherNode}/maintenance-windows/${mine.body.data.id}`)).status).toBe(404);
  });
});
