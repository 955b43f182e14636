import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { loadConfig, type Config } from '../../server/config';
import { createSequelize } from '../../server/db/sequelize';
import { rotateToken } from '../../server/services/ingestTokens';
import { buildUser, PASSWORD, truncateAll } from '../helpers/api';
import { buildNode } from '../helpers/factories';
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
});
