import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { loadConfig, type Config } from '../../server/config';
import { QueryTypes } from 'sequelize';
import { createSequelize } from '../../server/db/sequelize';
import { startJobs } from '../../server/jobs/scheduler';
import { Node } from '../../server/models';
import { rotateToken } from '../../server/services/ingestTokens';
import { buildUser, PASSWORD, truncateAll } from '../helpers/api';
import { buildNeighbourhood, buildNode, buildSite } from '../helpers/factories';
import { startTcpProxy } from '../helpers/tcpProxy';

// The app reaches the test database through a proxy the test can cut, as a PostgreSQL restart would.
describe('while PostgreSQL is unreachable', () => {
  let proxy: Awaited<ReturnType<typeof startTcpProxy>>;
  let made: ReturnType<typeof createApp>;
  let sequelize: ReturnType<typeof createSequelize>;
  let config: Config;
  let token = '';

  beforeAll(async () => {
    const real = new URL(process.env.DATABASE_URL!);
    proxy = await startTcpProxy(Number(real.port || 5432), real.hostname);
    const viaProxy = new URL(real);
    viaProxy.port = String(proxy.port);
    config = loadConfig({ ...process.env, NODE_ENV: 'test', DATABASE_URL: viaProxy.toString(), DATABASE_PROBE_INTERVAL_MS: '200' });
    sequelize = createSequelize(config.databaseUrl, 4);
    made = createApp({ config, sequelize });
    await truncateAll(sequelize);
    const node = await buildNode();
    token = await rotateToken(sequelize, node.id, new Date());
  });
  afterAll(async () => {
    await made?.close();
    await sequelize?.close();
    await proxy?.close();
  });

  const report = (seq: number) =>
    request(made.app).post('/api/v1/heartbeats').set('Authorization', `Bearer ${token}`).send({ seq, bootId: 'b00t-1', sentAt: new Date().toISOString() });

  it('answers 503 database_unavailable with Retry-After everywhere, never 500, and resumes by itself', async () => {
    const user = await buildUser({ role: 'admin' });
    const agent = request.agent(made.app);
    expect((await agent.post('/api/v1/session').send({ email: user.email, password: PASSWORD })).status).toBe(200);
    expect((await report(1)).status).toBe(202);

    proxy.set('refuse');
    const health = await request(made.app).get('/api/health');
    expect(health.status).toBe(503);
    expect(health.headers['retry-after']).toMatch(/^\d+$/);
    expect(health.body.error.code).toBe('database_unavailable');

    const answers = await Promise.all([
      report(2),
      agent.get('/api/v1/nodes'),
      agent.get('/api/v1/session'),
      request(made.app).post('/api/v1/session').send({ email: user.email, password: PASSWORD }),
      request(made.app).get('/api/v1/public/status'),
    ]);
    for (const res of answers) {
      expect(res.status).toBe(503);
      expect(res.headers['retry-after']).toMatch(/^\d+$/);
      expect(res.body.error).toEqual({ code: 'database_unavailable', message: expect.stringContaining('cannot reach its database') });
    }
    expect(made.databaseWatch.up).toBe(false);

    proxy.set('pass');
    const cutAt = Date.now();
    let accepted = await report(2);
    while (accepted.status !== 202 && Date.now() - cutAt < 10_000) {
      expect(accepted.status).toBe(503);
      await new Promise((r) => setTimeout(r, 100));
      accepted = await report(2);
    }
    const recoveredInMs = Date.now() - cutAt;
    console.log(`database outage test: reports accepted again ${recoveredInMs} ms after the database returned`);
    expect(accepted.status).toBe(202);
    expect(recoveredInMs).toBeLessThan(10_000);
    expect((await agent.get('/api/v1/nodes')).status).toBe(200); // the session survived in PostgreSQL
    expect((await request(made.app).get('/api/health')).body).toEqual({ status: 'ok' });
  });

  it('treats the silence its own outage caused like its own downtime: one notice to admins, no outage mail to hosts', async () => {
    const admin = await buildUser({ role: 'admin' });
    const host = await buildUser({ role: 'host' });
    const operator = await buildUser({ role: 'operator' });
    const hood = await buildNeighbourhood({ operators: [operator] });
    const node = await buildNode({ siteId: (await buildSite({ neighbourhoodId: hood.id, hostUserId: host.id })).id });
    await Node.update({ reportIntervalS: 10, thresholds: { offlineAfterIntervals: 1 } }, { where: { id: node.id } });
    const nodeToken = await rotateToken(sequelize, node.id, new Date());
    const send = () =>
      request(made.app).post('/api/v1/heartbeats').set('Authorization', `Bearer ${nodeToken}`).send({ seq: 1, sentAt: new Date().toISOString() });
    expect((await send()).status).toBe(202);
    const jobs = startJobs({ ...config, healthCheckIntervalMs: 200 }, sequelize, made.databaseWatch);
    try {
      await new Promise((r) => setTimeout(r, 600));
      // The database is away for longer than the node's whole offline window (10 s).
      proxy.set('refuse');
      const cutAt = Date.now();
      while (made.databaseWatch.up && Date.now() - cutAt < 5000) await new Promise((r) => setTimeout(r, 50));
      expect(made.databaseWatch.up).toBe(false);
      await new Promise((r) => setTimeout(r, 11_000));
      expect((await send()).status).toBe(503); // the node could not report
      proxy.set('pass');
      const backAt = Date.now();
      while (!made.databaseWatch.up && Date.now() - backAt < 10_000) await new Promise((r) => setTimeout(r, 50));
      await new Promise((r) => setTimeout(r, 1500)); // several ticks after the return
    } finally {
      await jobs.stop();
    }
    const mail = await sequelize.query<{ kind: string; recipient_user_id: number }>(
      'SELECT kind, recipient_user_id FROM outbox WHERE recipient_user_id = ANY($1) ORDER BY id',
      { bind: [[admin.id, host.id, operator.id]], type: QueryTypes.SELECT },
    );
    expect((await Node.findByPk(node.id))!.state).toBe('online');
    expect(mail).toEqual([{ kind: 'self-check', recipient_user_id: admin.id }]);
  }, 40_000);
});
