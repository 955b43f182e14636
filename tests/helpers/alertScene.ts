import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { expect } from 'vitest';
import { runOutboxSender } from '../../server/jobs/outboxSender';
import { runSilenceCheck } from '../../server/jobs/silenceCheck';
import { AlertPreference, type User } from '../../server/models';
import { buildUser, call, signIn, type TestContext } from './api';
import { buildNeighbourhood, buildNode, buildSite } from './factories';

/** A watched neighbourhood: its operator, another neighbourhood's operator, the host, an admin and a reporting node. */
export async function alertScene(ctx: TestContext, opts: { nodeName?: string; hostName?: string; siteName?: string } = {}) {
  const operator = await buildUser({ role: 'operator' });
  const otherOperator = await buildUser({ role: 'operator' });
  const host = await buildUser({ role: 'host', name: opts.hostName });
  const otherHost = await buildUser({ role: 'host' });
  const admin = await buildUser({ role: 'admin' });
  const hood = await buildNeighbourhood({ operators: [operator] });
  const otherHood = await buildNeighbourhood({ operators: [otherOperator] });
  const site = await buildSite({ neighbourhoodId: hood.id, hostUserId: host.id, name: opts.siteName });
  const node = await buildNode({ siteId: site.id, name: opts.nodeName });
  const otherSite = await buildSite({ neighbourhoodId: otherHood.id, hostUserId: otherHost.id });
  await buildNode({ siteId: otherSite.id });
  const adminAgent = await signIn(ctx, admin);
  const res = await call(adminAgent, 'post', `/api/v1/nodes/${node.id}/ingest-token`);
  expect(res.status).toBe(201);
  const token = res.body.token as string;
  let seq = 0;
  const report = () =>
    request(ctx.app)
      .post('/api/v1/heartbeats')
      .set('Authorization', `Bearer ${token}`)
      .send({ seq: ++seq, sentAt: new Date().toISOString(), radios: [{ iface: 'wlan0', signalDbm: -60, noiseDbm: -95 }], throughputMbps: 40, uptimeS: 3600 });
  const everyone = [operator, otherOperator, host, otherHost, admin];
  return {
    operator,
    otherOperator,
    host,
    otherHost,
    admin,
    hood,
    site,
    node,
    token,
    report,
    everyone,
    addresses: (...users: User[]) => users.map((u) => u.email),
  };
}

/** Silence check as the scheduler runs it, with a check interval long enough that skipped minutes never look like Parapet was down. */
export const silenceCheck = (ctx: TestContext) => runSilenceCheck(ctx.sequelize, ctx.config, ctx.config.now(), 1_000_000_000);
export const sendOutbox = (ctx: TestContext) => runOutboxSender(ctx.sequelize, ctx.config);

export async function outboxRows(ctx: TestContext, nodeId: number) {
  return ctx.sequelize.query<{
    id: string;
    kind: string;
    recipient_user_id: number;
    status: string;
    subject: string;
    dedupe_key: string;
    next_attempt_at: Date;
    attempts: number;
    last_error: string | null;
  }>('SELECT * FROM outbox WHERE node_id = $1 ORDER BY id', { bind: [nodeId], type: QueryTypes.SELECT });
}

export const setPreferences = (userId: number, values: Partial<AlertPreference['_creationAttributes']>) => AlertPreference.upsert({ userId, ...values });
