import { execFile } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { promisify } from 'node:util';
import { QueryTypes, type Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createSequelize } from '../../server/db/sequelize';
import { createMigrator } from '../../server/db/umzug';
import { initModels, Node } from '../../server/models';
import { rotateToken } from '../../server/services/ingestTokens';
import { startServerProcess, type ServerProcess } from '../../server/tools/serverProcess';
import { buildUser } from '../helpers/api';
import { startDrillCluster } from '../helpers/drillCluster';
import { buildNeighbourhood, buildNode, buildSite } from '../helpers/factories';
import { mailTo } from '../helpers/mailFake';
import { startTcpProxy } from '../helpers/tcpProxy';

// Fault drills: a real Parapet process, its own PostgreSQL cluster (restarted for real) and the
// real SMTP fake behind a proxy that can hang. Each drill prints its figures. Bounded: the longest
// (SMTP hung for the 2 minutes the drill calls for) takes about 3 minutes.
// The compiled server (as start.sh and systemd run it) starts in a second even on a busy machine.
const BUILT = '.test-data/drills/server';
const start = (env: Record<string, string>) => startServerProcess(env, { args: ['--enable-source-maps', `${BUILT}/index.js`], timeoutMs: 60_000 });
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const secs = (ms: number) => `${(ms / 1000).toFixed(1)} s`;

describe('fault drills', () => {
  let cluster: Awaited<ReturnType<typeof startDrillCluster>>;
  let smtp: Awaited<ReturnType<typeof startTcpProxy>>;
  let sequelize: Sequelize;
  let server: ServerProcess | null = null;
  const env = () => ({
    DATABASE_URL: cluster.url,
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(smtp.port),
    SMTP_TIMEOUT_MS: '5000',
    HEALTH_CHECK_INTERVAL_MS: '1000',
    DATABASE_PROBE_INTERVAL_MS: '500',
    INGEST_RATE_LIMIT_PER_MIN: '1000000',
    SOCKET_ADAPTER: 'postgres',
    SESSION_SECRET: 'drill-session-secret-0123456789',
  });

  beforeAll(async () => {
    await promisify(execFile)('npx', ['vite', 'build', '--config', 'vite.server.config.ts', '--outDir', BUILT, '--logLevel', 'warn'], { timeout: 240_000 });
    cluster = await startDrillCluster();
    smtp = await startTcpProxy(Number(process.env.SMTP_PORT ?? 1025));
    sequelize = createSequelize(cluster.url, 4);
    await createMigrator(sequelize).up();
    initModels(sequelize);
  }, 300_000);
  afterAll(async () => {
    await server?.stop();
    await sequelize?.close();
    await smtp?.close();
    await cluster?.remove();
  }, 60_000);

  async function reportingNodes(count: number) {
    const out: { nodeId: number; token: string; bootId: string; seq: number }[] = [];
    for (let i = 0; i < count; i++) {
      const node = await buildNode();
      out.push({ nodeId: node.id, token: await rotateToken(sequelize, node.id, new Date()), bootId: randomUUID(), seq: 0 });
    }
    return out;
  }
  const storedSeqs = async (nodeId: number, bootId: string) =>
    new Set(
      (
        await sequelize.query<{ seq: string }>("SELECT seq::text FROM heartbeats WHERE node_id = $1 AND coalesce(boot_id, '') = $2", {
          bind: [nodeId, bootId],
          type: QueryTypes.SELECT,
        })
      ).map((r) => Number(r.seq)),
    );
  const post = async (url: string, token: string, body: unknown) => {
    try {
      const res = await fetch(`${url}/api/v1/heartbeats`, {
        method: 'POST',
        headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' },
        body: JSON.stringify(body),
      });
      return {
        status: res.status,
        body: (await res.json().catch(() => null)) as { accepted?: number; duplicates?: number; error?: { code: string } } | null,
        retryAfter: res.headers.get('retry-after'),
      };
    } catch {
      return { status: 0, body: null, retryAfter: null }; // no answer (the process is gone)
    }
  };

  it('PostgreSQL restarted while 8 nodes stream reports: every 202 is stored, reports are accepted again within 15 s, the process stays up', async () => {
    server = await start(env());
    const nodes = await reportingNodes(8);
    const statuses = new Map<number, number>();
    let restartAt = 0;
    let restartDoneAt = 0;
    const backAt = new Map<number, number>();
    let stop = false;
    const acked = new Map<number, number[]>();
    const stream = async (n: (typeof nodes)[number]) => {
      acked.set(n.nodeId, []);
      while (!stop) {
        const seq = n.seq + 1;
        const res = await post(server!.url, n.token, { seq, bootId: n.bootId, sentAt: new Date().toISOString(), uptimeS: seq });
        statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
        if (res.status === 503) expect(res.retryAfter).toMatch(/^\d+$/);
        if (res.status === 202) {
          n.seq = seq;
          acked.get(n.nodeId)!.push(seq);
          if (restartAt && !backAt.has(n.nodeId) && restartDoneAt) backAt.set(n.nodeId, Date.now());
        }
        await sleep(res.status === 202 ? 40 : 200); // about 25 reports a second per node; a pause before resending
      }
    };
    const streams = Promise.all(nodes.map(stream));
    await sleep(2000);
    restartAt = Date.now();
    await cluster.restart();
    restartDoneAt = Date.now();
    const deadline = Date.now() + 20_000;
    while (backAt.size < nodes.length && Date.now() < deadline) await sleep(100);
    await sleep(1000);
    stop = true;
    await streams;

    let lost = 0;
    let total = 0;
    for (const n of nodes) {
      const stored = await storedSeqs(n.nodeId, n.bootId);
      for (const seq of acked.get(n.nodeId)!) {
        total++;
        if (!stored.has(seq)) lost++;
      }
    }
    const worstBackMs = Math.max(...nodes.map((n) => (backAt.get(n.nodeId) ?? Infinity) - restartAt));
    // pg_ctl's own restart takes several seconds on a busy machine; Parapet's part starts when it is back.
    const worstAfterReturnMs = Math.max(...nodes.map((n) => (backAt.get(n.nodeId) ?? Infinity) - restartDoneAt));
    const health = await fetch(`${server.url}/api/health`);
    console.log(
      `drill "PostgreSQL restart": ${total} reports answered 202, ${lost} of them missing; answers ${JSON.stringify(Object.fromEntries(statuses))}; ` +
        `restart took ${secs(restartDoneAt - restartAt)}; every node accepted again within ${secs(worstBackMs)} of the restart command, ` +
        `${secs(worstAfterReturnMs)} of the database being back; process up: ${server.child.exitCode === null}`,
    );
    expect(lost).toBe(0);
    expect([...statuses.keys()].filter((s) => s !== 202 && s !== 503)).toEqual([]);
    expect(worstAfterReturnMs).toBeLessThan(15_000);
    expect(server.child.exitCode).toBeNull();
    expect(health.status).toBe(200);
    expect(server.output()).not.toMatch(/unhandled|Unhandled 'error' event/);
  }, 120_000);

  it('a router reboots (new boot id, seq 1): its reports move its state', async () => {
    const [n] = await reportingNodes(1);
    await Node.update({ reportIntervalS: 10, thresholds: { offlineAfterIntervals: 1 } }, { where: { id: n.nodeId } });
    const before = await post(server!.url, n.token, { seq: 2 ** 53 - 1, bootId: n.bootId, sentAt: new Date().toISOString() });
    expect(before.status).toBe(202);
    // Silent for a whole window: the process's own silence check marks it offline.
    const t0 = Date.now();
    while ((await Node.findByPk(n.nodeId))!.state !== 'offline' && Date.now() - t0 < 30_000) await sleep(500);
    expect((await Node.findByPk(n.nodeId))!.state).toBe('offline');
    const rebooted = await post(server!.url, n.token, { seq: 1, bootId: randomUUID(), sentAt: new Date().toISOString() });
    const after = (await Node.findByPk(n.nodeId))!;
    console.log(
      `drill "router reboot": seq 2^53-1 then offline after ${secs(Date.now() - t0)}; ` +
        `new boot, seq 1 answered ${rebooted.status} ${JSON.stringify(rebooted.body)}; node now ${after.state}, last seq ${after.lastSeq}`,
    );
    expect(rebooted.body).toEqual({ accepted: 1, duplicates: 0 });
    expect(after.state).toBe('online');
    expect(after.lastSeq).toBe('1');
  }, 60_000);

  it('the app is killed (SIGKILL) mid-batch and mid-send, then restarted: nothing acknowledged is lost, no mail is sent twice', async () => {
    const nodes = await reportingNodes(4);
    // Mail waiting in the outbox, the SMTP server wedged: the sender is mid-send when the process dies.
    const address = `drill-${randomUUID().slice(0, 8)}@example.test`;
    const dedupeKeys = Array.from({ length: 5 }, (_, i) => `drill-kill:${address}:${i}`);
    for (const key of dedupeKeys) {
      await sequelize.query(
        `INSERT INTO outbox (kind, recipient_address, recipient_name, subject, text_body, html_body, dedupe_key, next_attempt_at, created_at, updated_at)
         VALUES ('self-check', $1, 'Drill', $2, 'drill', '<p>drill</p>', $2, now(), now(), now())`,
        { bind: [address, key] },
      );
    }
    smtp.set('hang');
    const acked: { nodeId: number; bootId: string; seqs: number[] }[] = [];
    let resent = 0;
    let duplicates = 0;
    let current = server!;
    const sendBatches = async (n: (typeof nodes)[number], rounds: number) => {
      for (let r = 0; r < rounds; r++) {
        const seqs = Array.from({ length: 50 }, (_, i) => n.seq + 1 + i);
        const body = {
          reports: seqs.map((seq) => ({ seq, bootId: n.bootId, sentAt: new Date().toISOString(), radios: [{ iface: 'wlan0', signalDbm: -61 }] })),
        };
        for (let attempt = 0; ; attempt++) {
          const res = await post(current.url, n.token, body);
          if (res.status === 202) {
            acked.push({ nodeId: n.nodeId, bootId: n.bootId, seqs });
            duplicates += res.body?.duplicates ?? 0;
            if (attempt) resent++;
            break;
          }
          expect([0, 503]).toContain(res.status);
          await sleep(250);
        }
        n.seq += 50;
      }
    };
    const traffic = Promise.all(nodes.map((n) => sendBatches(n, 30)));
    // Kill once the sender has claimed the mail and hangs on the wedged SMTP server, with batches in flight.
    const claimDeadline = Date.now() + 30_000;
    const claimed = async () =>
      (
        await sequelize.query<{ n: number }>('SELECT count(*)::int AS n FROM outbox WHERE dedupe_key = ANY($1) AND attempts > 0', {
          bind: [dedupeKeys],
          type: QueryTypes.SELECT,
        })
      )[0].n;
    while ((await claimed()) === 0 && Date.now() < claimDeadline) await sleep(100);
    await sleep(300);
    const killedAt = Date.now();
    current.child.kill('SIGKILL');
    await new Promise((r) => current.child.once('exit', r));
    const outboxAtKill = await sequelize.query<{ status: string; attempts: number }>('SELECT status, attempts FROM outbox WHERE dedupe_key = ANY($1)', {
      bind: [dedupeKeys],
      type: QueryTypes.SELECT,
    });
    smtp.set('pass');
    current = await start(env());
    server = current;
    const upAgainMs = Date.now() - killedAt;
    await traffic;

    let lost = 0;
    let total = 0;
    for (const a of acked) {
      const stored = await storedSeqs(a.nodeId, a.bootId);
      total += a.seqs.length;
      lost += a.seqs.filter((s) => !stored.has(s)).length;
    }
    const t0 = Date.now();
    let mails = await mailTo([address]);
    while (mails.length < dedupeKeys.length && Date.now() - t0 < 90_000) {
      await sleep(1000);
      mails = await mailTo([address]);
    }
    await sleep(3000); // anything sent twice would arrive in this time
    mails = await mailTo([address]);
    const perMessage = new Map<string, number>();
    for (const m of mails) perMessage.set(m.headers['message-id'], (perMessage.get(m.headers['message-id']) ?? 0) + 1);
    console.log(
      `drill "SIGKILL mid-batch": ${total} reports acknowledged in ${acked.length} batches, ${lost} missing; ` +
        `${resent} batches resent after the kill, ${duplicates} duplicates reported back; ` +
        `server answering again ${secs(upAgainMs)} after the kill; ` +
        `outbox at the kill ${JSON.stringify(outboxAtKill.map((o) => `${o.status}/${o.attempts}`))}; ` +
        `mails ${mails.length} of ${dedupeKeys.length}, arrived ${secs(Date.now() - t0 - 3000)} after the restart, ` +
        `most copies of one message: ${Math.max(...perMessage.values())}`,
    );
    expect(lost).toBe(0);
    expect(outboxAtKill.some((o) => o.attempts > 0)).toBe(true); // it really died mid-send
    expect(mails).toHaveLength(dedupeKeys.length);
    expect([...perMessage.values()].every((n) => n === 1)).toBe(true);
  }, 180_000);

  it('SMTP hangs for 2 minutes during an outage: the outage mail arrives exactly once, within 90 s of SMTP returning', async () => {
    const operator = await buildUser({ role: 'operator' });
    const hood = await buildNeighbourhood({ operators: [operator] });
    const site = await buildSite({ neighbourhoodId: hood.id });
    const node = await buildNode({ siteId: site.id });
    await Node.update({ reportIntervalS: 10, thresholds: { offlineAfterIntervals: 1 } }, { where: { id: node.id } });
    const token = await rotateToken(sequelize, node.id, new Date());
    smtp.set('hang');
    const hungAt = Date.now();
    expect((await post(server!.url, token, { seq: 1, bootId: randomUUID(), sentAt: new Date().toISOString() })).status).toBe(202);
    // The node goes silent; its outage opens and its mail starts failing against the wedged server.
    while ((await Node.findByPk(node.id))!.state !== 'offline' && Date.now() - hungAt < 60_000) await sleep(500);
    const offlineAt = Date.now();
    await sleep(Math.max(0, 120_000 - (Date.now() - hungAt)));
    const [duringHang] = await sequelize.query<{ attempts: number; status: string; next: Date }>(
      `SELECT attempts, status, next_attempt_at AS next FROM outbox WHERE node_id = $1 AND kind = 'node-offline' AND recipient_user_id = $2`,
      { bind: [node.id, operator.id], type: QueryTypes.SELECT },
    );
    smtp.set('pass');
    const backAt = Date.now();
    let mails = await mailTo([operator.email]);
    while (mails.length === 0 && Date.now() - backAt < 90_000) {
      await sleep(500);
      mails = await mailTo([operator.email]);
    }
    const arrivedAfterMs = Date.now() - backAt;
    await sleep(5000); // a second copy would show up here
    mails = await mailTo([operator.email]);
    console.log(
      `drill "SMTP hung 2 min": node offline ${secs(offlineAt - hungAt)} into the hang; ` +
        `outage mail tried ${duringHang?.attempts} times while hung (${duringHang?.status}); ` +
        `arrived ${secs(arrivedAfterMs)} after SMTP returned; copies received: ${mails.length}`,
    );
    expect(duringHang?.attempts).toBeGreaterThanOrEqual(2);
    expect(mails).toHaveLength(1);
    expect(mails[0].subject).toMatch(/offline|down/i);
    expect(arrivedAfterMs).toBeLessThan(90_000);
  }, 300_000);
});
