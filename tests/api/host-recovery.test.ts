import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { beforeEach, describe, expect, it } from 'vitest';
import { signLink } from '../../server/mail/signedLinks';
import { Outage } from '../../server/models';
import { buildUser, call, signIn, SIGNED_OUT, type TestContext, useApi } from '../helpers/api';
import { alertScene, silenceCheck } from '../helpers/alertScene';
import { manualClock } from '../helpers/clock';
import { topologyScene } from '../helpers/topologyScene';

const clock = manualClock();
let day = 1;
// Report interval 60 s and three missed intervals: offline 180 s after the last report.
const OFFLINE_AFTER_S = 181;

/** The link in a person's outage mail for this outage (recovery or acknowledge). */
async function linkInMail(ctx: TestContext, outageId: number, userId: number, kind: 'recover' | 'acknowledge') {
  const rows = await ctx.sequelize.query<{ text_body: string }>('SELECT text_body FROM outbox WHERE outage_id = $1 AND recipient_user_id = $2 ORDER BY id', {
    bind: [outageId, userId],
    type: QueryTypes.SELECT,
  });
  const pattern = kind === 'recover' ? /\/recover\?t=([A-Za-z0-9._-]+)/ : /\/acknowledge\?t=([A-Za-z0-9._-]+)/;
  const found = rows.map((r) => pattern.exec(r.text_body)?.[1]).find(Boolean);
  if (!found) throw new Error(`no ${kind} link in the mail to user ${userId}`);
  return found;
}

/** A reporting node that then goes silent long enough to open an outage (mail written at once). */
async function downScene(ctx: TestContext) {
  const s = await alertScene(ctx, { nodeName: `mill-${day}`, siteName: `Mill roof ${day}`, hostName: 'Ada Quist' });
  expect((await s.report()).status).toBe(202);
  clock.advance(OFFLINE_AFTER_S);
  await silenceCheck(ctx);
  const outage = (await Outage.findOne({ where: { nodeId: s.node.id, endedAt: null } }))!;
  expect(outage).not.toBeNull();
  return { ...s, outage };
}

describe('host recovery steps on an outage', () => {
  const ctx = useApi({ now: clock.now });
  beforeEach(async () => {
    clock.set(`2026-09-${String(day++).padStart(2, '0')}T12:00:00Z`);
    ctx.config.alertGraceS = null;
    await silenceCheck(ctx); // earlier tests' nodes go quiet here
  });

  it('POST /outages/:id/host-steps: 401, 400 per field, 404 out of scope, 201 for the host and the operator, then in the timeline', async () => {
    const s = await downScene(ctx);
    const url = `/api/v1/outages/${s.outage.id}/host-steps`;
    const out = await request(ctx.app).post(url).send({ step: 'checked-power' });
    expect(out.status).toBe(401);
    expect(out.body.error).toMatchObject(SIGNED_OUT);

    const host = await signIn(ctx, s.host);
    const bad = await call(host, 'post', url, { step: 'climbed-the-mast', note: 'x'.repeat(501) });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details).toEqual([
      { path: 'step', message: 'step must be one of checked-power, replugged-injector, restarted-router, cannot-reach, other' },
      { path: 'note', message: 'note must be at most 500 characters' },
    ]);

    for (const stranger of [s.otherHost, s.otherOperator]) {
      const res = await call(await signIn(ctx, stranger), 'post', url, { step: 'checked-power' });
      expect(res.status).toBe(404);
    }
    const big = await call(await signIn(ctx, s.operator), 'post', '/api/v1/outages/99999999999/host-steps', { step: 'other' });
    expect(big.status).toBe(404);

    const mine = await call(host, 'post', url, { step: 'replugged-injector', note: '  the light came on  ' });
    expect(mine.status).toBe(201);
    expect(mine.body.data).toEqual({
      at: clock.now().toISOString(),
      kind: 'host-step',
      step: 'replugged-injector',
      byUserId: s.host.id,
      text: 'Ada Quist (host) unplugged the PoE injector, waited 10 s and plugged it back in: the light came on',
    });
    clock.advance(30);
    const byOperator = await call(await signIn(ctx, s.operator), 'post', url, { step: 'other', note: 'Phoned Ada: the mains breaker had tripped' });
    expect(byOperator.status).toBe(201);

    // A cap keeps a leaked link from filling the timeline.
    await ctx.sequelize.query(`INSERT INTO outage_host_steps (outage_id, step, by_user_id, at) SELECT $1, 'other', $2, $3 FROM generate_series(1, 98)`, {
      bind: [s.outage.id, s.host.id, clock.now()],
    });
    const capped = await call(host, 'post', url, { step: 'checked-power' });
    expect(capped.status).toBe(409);
    expect(capped.body.error.message).toMatch(/already has 100 recorded steps/);
    await ctx.sequelize.query(`DELETE FROM outage_host_steps WHERE outage_id = $1 AND note IS NULL AND step = 'other'`, { bind: [s.outage.id] });

    const detail = await call(await signIn(ctx, s.operator), 'get', `/api/v1/outages/${s.outage.id}`);
    expect(detail.status).toBe(200);
    expect(detail.body.data.abilities.recordHostStep).toBe(true);
    expect(detail.body.data.timeline.map((e: { kind: string }) => e.kind)).toEqual(['opened', 'host-step', 'host-step']);
    expect(detail.body.data.timeline[2]).toMatchObject({ byUserId: s.operator.id, text: `${s.operator.name} phoned Ada: the mains breaker had tripped` });
  });

  it('the host opens the mail link without a password, sees the checklist state and records steps; bad links get 400 or 410', async () => {
    const s = await downScene(ctx);
    const t = await linkInMail(ctx, s.outage.id, s.host.id, 'recover');

    const page = await request(ctx.app).get('/api/v1/recovery').query({ t });
    expect(page.status).toBe(200);
    expect(page.headers['cache-control']).toBe('no-store');
    expect(page.body.data).toMatchObject({
      outageId: s.outage.id,
      node: { id: s.node.id, name: s.node.name, state: 'offline' },
      siteName: s.site.name,
      upstream: null,
      steps: [],
      endedAt: null,
      operators: [{ name: s.operator.name }],
      acknowledgedBy: null,
    });
    expect(page.body.data.whatNext).toContain(s.operator.name);

    const step = await request(ctx.app).post('/api/v1/recovery/host-steps').send({ t, step: 'checked-power' });
    expect(step.status).toBe(201);
    expect(step.body.data).toMatchObject({ kind: 'host-step', step: 'checked-power', byUserId: s.host.id, text: 'Ada Quist (host) checked the power' });
    expect((await request(ctx.app).get('/api/v1/recovery').query({ t })).body.data.steps).toHaveLength(1);

    const invalid = await request(ctx.app).post('/api/v1/recovery/host-steps').send({ t, step: 'rebooted-the-internet' });
    expect(invalid.status).toBe(400);
    expect(invalid.body.error.details[0].path).toBe('step');
    const missing = await request(ctx.app).post('/api/v1/recovery/host-steps').send({ step: 'other' });
    expect(missing.status).toBe(400);
    expect(missing.body.error.details[0]).toEqual({ path: 't', message: 't is required: open the page from the link in your e-mail' });

    // A changed outage id breaks the signature; an operator's acknowledge link is not a recovery link.
    const tampered = t.replace(`.${s.outage.id}.`, `.${s.outage.id + 1}.`);
    expect((await request(ctx.app).get('/api/v1/recovery').query({ t: tampered })).body.error.code).toBe('bad_link');
    const ack = await linkInMail(ctx, s.outage.id, s.operator.id, 'acknowledge');
    expect((await request(ctx.app).get('/api/v1/recovery').query({ t: ack })).status).toBe(400);
    expect((await request(ctx.app).get('/api/v1/recovery')).status).toBe(400);

    // A link for someone who no longer hosts the node: 403; and every link expires (48 h by default).
    const formerHost = await buildUser({ role: 'host' });
    const exp = Math.floor(clock.now().getTime() / 1000) + 3600;
    const notTheirs = signLink(ctx.config.sessionSecret, { purpose: 'recover', userId: formerHost.id, outageId: s.outage.id, expiresAtS: exp });
    expect((await request(ctx.app).get('/api/v1/recovery').query({ t: notTheirs })).status).toBe(403);
    clock.advance(ctx.config.recoveryLinkHours * 3600 + 1);
    const late = await request(ctx.app).get('/api/v1/recovery').query({ t });
    expect(late.status).toBe(410);
    expect(late.body.error.code).toBe('link_expired');
  });

  it('a host cut off behind an upstream failure is told nothing is needed at their place, and cannot record steps', async () => {
    const s = await topologyScene(ctx, clock);
    await s.reportAll();
    await s.runFor(OFFLINE_AFTER_S, [s.uplink.node, s.relay.node, s.farLeaf.node, s.twoPaths.node]);
    await silenceCheck(ctx);
    const root = (await Outage.findOne({ where: { nodeId: s.backhaul.node.id, endedAt: null } }))!;
    const leaf = s.leaves[0];
    const t = await linkInMail(ctx, root.id, leaf.host.id, 'recover');
    const page = await request(ctx.app).get('/api/v1/recovery').query({ t });
    expect(page.status).toBe(200);
    expect(page.body.data).toMatchObject({
      node: { id: leaf.node.id, state: 'stranded' },
      upstream: { nodeName: s.backhaul.node.name, siteName: `${s.backhaul.node.name} roof` },
    });
    const step = await request(ctx.app).post('/api/v1/recovery/host-steps').send({ t, step: 'checked-power' });
    expect(step.status).toBe(409);
    expect(step.body.error.message).toMatch(/^Nothing is needed at your place/);
    // The root's own host gets the checklist, with no upstream cause.
    const own = await linkInMail(ctx, root.id, s.backhaul.host.id, 'recover');
    expect((await request(ctx.app).get('/api/v1/recovery').query({ t: own })).body.data.upstream).toBeNull();
  });
});
