// `npm run bench:town`: a synthetic town reporting through one proxy to two Parapet instances that share one
// PostgreSQL, for BENCH_TOWN_DURATION_S (default 600). Prints reports lost, latency, silence-check ticks, memory,
// live events across instances and storage per node per day, then one JSON line. Stops everything it started.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import { randomBytes } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { io as connect, type Socket } from 'socket.io-client';
import { hashPassword } from '../auth/passwords';
import { loadConfig } from '../config';
import { createSequelize } from '../db/sequelize';
import { createMigrator } from '../db/umzug';
import { rollUp } from '../jobs/heartbeatStorage';
import { sessionCookieOf } from './apiClient';
import { freePort, startServerProcess, type ServerProcess } from './serverProcess';
import { DEFAULT_FAULTS, TOWN_REPORT_INTERVAL_S, TownReporter, planTown, seedTown } from './simulateTown';

const databaseUrl = process.env.DATABASE_URL;
if (!databaseUrl) {
  console.error('DATABASE_URL is not set: give the bench a PostgreSQL database of its own (it migrates it and leaves the town in it).');
  process.exit(2);
}
const NODES = Number(process.env.BENCH_TOWN_NODES ?? 10_000);
const DURATION_S = Number(process.env.BENCH_TOWN_DURATION_S ?? 600);
const SAMPLE_S = Number(process.env.BENCH_TOWN_SAMPLE_S ?? 30);
if (!Number.isInteger(NODES) || NODES < 1 || !(DURATION_S > 0) || !(SAMPLE_S > 0)) {
  console.error('BENCH_TOWN_NODES must be a whole number ≥ 1; BENCH_TOWN_DURATION_S and BENCH_TOWN_SAMPLE_S positive seconds');
  process.exit(2);
}
const TICK_TARGET_MS = 2000;
const P99_TARGET_MS = 250;

const t0 = Date.now();
const say = (line: string) => console.log(`[${((Date.now() - t0) / 1000).toFixed(0).padStart(4)} s] ${line}`);
const sequelize = createSequelize(databaseUrl, 4);
const config = loadConfig({ ...process.env, DATABASE_URL: databaseUrl });

const started: { stop: () => Promise<void> }[] = [];
const sockets: Socket[] = [];
let reporter: TownReporter | null = null;
// Ctrl-C (or a supervisor's SIGTERM) stops what the bench started, as the end of a run does.
for (const signal of ['SIGINT', 'SIGTERM'] as const)
  process.once(signal, () => {
    console.log(`${signal}: stopping the town, the instances and the proxy`);
    void Promise.allSettled([reporter?.stop(1000)])
      .then(() => Promise.allSettled([...started].reverse().map((s) => s.stop())))
      .finally(() => process.exit(130));
  });

async function startProxy(targets: { name: string; url: string }[]) {
  const port = await freePort();
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/tools/townProxy.ts'], {
    env: { ...process.env, PROXY_PORT: String(port), PROXY_TARGETS: targets.map((t) => `${t.name}=${t.url}`).join(',') },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout!.on('data', (d) => (output += d));
  child.stderr!.on('data', (d) => (output += d));
  const stop = () =>
    new Promise<void>((resolve) => {
      if (child.exitCode !== null || child.signalCode !== null) return resolve();
      child.once('exit', () => resolve());
      child.kill('SIGTERM');
      setTimeout(() => child.kill('SIGKILL'), 5000);
    });
  started.push({ stop });
  const deadline = Date.now() + 60_000;
  while (!output.includes('proxy listening')) {
    if (child.exitCode !== null || Date.now() > deadline) throw new Error(`the proxy did not start:\n${output}`);
    await new Promise((r) => setTimeout(r, 100));
  }
  return { url: `http://127.0.0.1:${port}`, pid: child.pid! };
}

const rssMb = (pid: number) => {
  try {
    const kb = /VmRSS:\s+(\d+)/.exec(fs.readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1];
    return kb ? Math.round(Number(kb) / 1024) : null;
  } catch {
    return null;
  }
};
const pct = (xs: number[], p: number) => (xs.length ? xs[Math.min(xs.length - 1, Math.floor(p * xs.length))] : NaN);
const r1 = (x: number) => Math.round(x * 10) / 10;

async function tableBytes(names: string[]) {
  let bytes = 0;
  for (const name of names) {
    const [row] = await sequelize.query<{ bytes: string | null }>(
      // A partitioned table: the sum over its tree (partitions, indexes, TOAST); a plain one: pg_partition_tree has no rows for it.
      `SELECT coalesce((SELECT sum(pg_total_relation_size(relid)) FROM pg_partition_tree(to_regclass($1))),
                       pg_total_relation_size(to_regclass($1)), 0) AS bytes`,
      { bind: [name], type: QueryTypes.SELECT },
    );
    bytes += Number(row.bytes ?? 0);
  }
  return bytes;
}

try {
  say(`bench:town: ${NODES} nodes, ${DURATION_S} s, two instances behind one proxy, database ${new URL(databaseUrl).pathname.slice(1)}`);
  await createMigrator(sequelize).up();
  const plan = planTown(NODES);
  const nodes = await seedTown(sequelize, plan);
  const ids = nodes.map((n) => n.id);
  say(`town ready: ${nodes.length} nodes in ${plan.hoods.length} neighbourhoods (inventory written straight to the database; reports go over HTTP)`);

  // One admin to watch: the same session cookie works on both instances (sessions live in PostgreSQL).
  const email = 'town-bench@parapet.example';
  const password = `town-${randomBytes(12).toString('hex')}`;
  const hash = await hashPassword(password);
  await sequelize.query(
    `INSERT INTO users (email, name, role, password_hash, created_at, updated_at) VALUES ($1, 'Town bench watcher', 'admin', $2, now(), now())
     ON CONFLICT (email) DO UPDATE SET password_hash = EXCLUDED.password_hash, active = true`,
    { bind: [email, hash] },
  );

  const env = {
    DATABASE_URL: databaseUrl,
    NODE_ENV: 'production',
    SESSION_SECRET: randomBytes(24).toString('hex'),
    JOB_TIMINGS_LOG: 'true',
    TRUST_PROXY: 'loopback',
    DATABASE_POOL_MAX: process.env.BENCH_TOWN_POOL_MAX ?? '20',
    // Outage mail goes nowhere: a closed loopback port, never the demo's mail fake.
    SMTP_HOST: '127.0.0.1',
    SMTP_PORT: String(await freePort()),
  };
  const [a, b] = await Promise.all([startServerProcess(env, { timeoutMs: 180_000 }), startServerProcess(env, { timeoutMs: 180_000 })]);
  started.push(a, b);
  const instances: Record<string, ServerProcess> = { a, b };
  const proxy = await startProxy([
    { name: 'a', url: a.url },
    { name: 'b', url: b.url },
  ]);
  say(`instances a ${a.url} (pid ${a.child.pid}), b ${b.url} (pid ${b.child.pid}); proxy ${proxy.url}`);

  const signIn = await fetch(`${a.url}/api/v1/session`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  if (signIn.status !== 200) throw new Error(`bench sign-in failed with ${signIn.status}: ${await signIn.text()}`);
  const cookie = sessionCookieOf(signIn);

  // Which instance took each node's latest report, to tell events that crossed instances from local ones.
  const lastInstance = new Map<number, string>();
  const live = { a: { local: 0, cross: 0, unknown: 0, states: 0 }, b: { local: 0, cross: 0, unknown: 0, states: 0 } };
  const stateCounts: Record<string, number> = {};
  for (const name of ['a', 'b'] as const) {
    await new Promise<void>((resolve, reject) => {
      const s = connect(instances[name].url, { transports: ['websocket'], extraHeaders: { cookie }, reconnection: true });
      s.on('node:figures', (e: { nodeId: number }) => {
        const via = lastInstance.get(e.nodeId);
        if (via === undefined) live[name].unknown++;
        else if (via === name) live[name].local++;
        else live[name].cross++;
      });
      s.on('node:state', (e: { state?: string }) => {
        live[name].states++;
        if (name === 'a' && e.state) stateCounts[e.state] = (stateCounts[e.state] ?? 0) + 1;
      });
      s.once('connect', () => resolve());
      s.once('connect_error', (err) => reject(new Error(`socket to instance ${name}: ${err.message}`)));
      sockets.push(s);
    });
  }
  say('one signed-in socket on each instance');

  const latencies: number[] = [];
  const statuses: Record<string, number> = {};
  const perInstance: Record<string, number> = {};
  const runStart = new Date();
  reporter = new TownReporter(proxy.url, plan, nodes, (r) => {
    latencies.push(r.ms);
    statuses[r.status] = (statuses[r.status] ?? 0) + 1;
    if (r.instance) perInstance[r.instance] = (perInstance[r.instance] ?? 0) + 1;
    if (r.status === 202 && r.instance) lastInstance.set(r.nodeId, r.instance);
  });
  reporter.start();
  say(
    `reporting: every node every ${TOWN_REPORT_INTERVAL_S} s (${(NODES / TOWN_REPORT_INTERVAL_S).toFixed(0)} posts/s); ${reporter.flakyCount} flaky nodes; ` +
      `a power cut every ${DEFAULT_FAULTS.powerCutEveryS} s for ${DEFAULT_FAULTS.powerCutS} s`,
  );

  const rss: { t: number; a: number | null; b: number | null; proxy: number | null }[] = [];
  let logged = 0;
  const sample = () => {
    const t = Math.round((Date.now() - runStart.getTime()) / 1000);
    rss.push({ t, a: rssMb(a.child.pid!), b: rssMb(b.child.pid!), proxy: rssMb(proxy.pid) });
    const recent = latencies.slice(-Math.max(1, Math.round((NODES / TOWN_REPORT_INTERVAL_S) * SAMPLE_S))).sort((x, y) => x - y);
    reporter!.log.slice(logged).forEach((l) => say(`  ${l}`));
    logged = reporter!.log.length;
    const c = reporter!.counts;
    say(
      `t=${t}s: ${c.posts} posts, ${c.accepted} reports accepted, ${c.refused} refused, ${c.failed} failed; ` +
        `last ${SAMPLE_S} s p50 ${pct(recent, 0.5).toFixed(0)} ms p99 ${pct(recent, 0.99).toFixed(0)} ms; RSS a ${rss.at(-1)!.a} MB, b ${rss.at(-1)!.b} MB; ` +
        `events a ${live.a.local}+${live.a.cross} cross, b ${live.b.local}+${live.b.cross} cross`,
    );
  };
  sample();
  const sampler = setInterval(sample, SAMPLE_S * 1000);
  await new Promise((r) => setTimeout(r, DURATION_S * 1000));
  clearInterval(sampler);
  sample();
  await reporter.stop(30_000);
  await new Promise((r) => setTimeout(r, Math.max(config.figuresThrottleMs, 1000) + 1000)); // the last throttled events
  sockets.forEach((s) => s.close());
  // Stop the instances first: whatever they had accepted is written before they exit.
  await Promise.all([a.stop(), b.stop()]);
  say('reports stopped; instances stopped');

  // BENCH_TOWN_LOG_DIR keeps both instances' output for a closer look.
  if (process.env.BENCH_TOWN_LOG_DIR) {
    fs.mkdirSync(process.env.BENCH_TOWN_LOG_DIR, { recursive: true });
    for (const name of ['a', 'b'] as const) fs.writeFileSync(`${process.env.BENCH_TOWN_LOG_DIR}/instance-${name}.log`, instances[name].output());
  }
  const [stored] = await sequelize.query<{ n: string }>('SELECT count(*) AS n FROM heartbeats WHERE node_id = ANY($1::int[]) AND received_at >= $2', {
    bind: [ids, runStart],
    type: QueryTypes.SELECT,
  });
  const accepted = reporter.counts.accepted;
  const found = Number(stored.n);
  const lost = Math.max(0, accepted - found);

  const ticks = { a: [] as number[], b: [] as number[] };
  for (const name of ['a', 'b'] as const) {
    for (const m of instances[name].output().matchAll(/job timing: silence-check ([\d.]+) ms \(leader/g)) ticks[name].push(Number(m[1]));
  }
  const allTicks = [...ticks.a, ...ticks.b].sort((x, y) => x - y);
  latencies.sort((x, y) => x - y);

  // Storage: roll the run's buckets up now (the job does this every minute; the upsert is idempotent), then size both.
  await rollUp(sequelize, new Date(), 300, Math.ceil(DURATION_S / 300) + 1);
  const rawBytes = await tableBytes(['heartbeats']);
  const rollupBytes = await tableBytes(['heartbeat_rollups']);
  const [counts] = await sequelize.query<{ raw: string; rollups: string }>(
    'SELECT (SELECT count(*) FROM heartbeats) AS raw, (SELECT count(*) FROM heartbeat_rollups) AS rollups',
    { type: QueryTypes.SELECT },
  );
  const rawPerReport = Number(counts.raw) ? rawBytes / Number(counts.raw) : NaN;
  const rollupPerRow = Number(counts.rollups) ? rollupBytes / Number(counts.rollups) : NaN;
  const reportsPerDay = 86_400 / TOWN_REPORT_INTERVAL_S;
  const rollupRowsPerDay = 86_400 / 300 + 86_400 / 3600;
  const rawPerNodeDay = rawPerReport * reportsPerDay;
  const rollupPerNodeDay = rollupPerRow * rollupRowsPerDay;
  const gb = (bytes: number) => r1(bytes / 1e9);
  const shown = (x: number, digits = 0) => (Number.isFinite(x) ? x.toFixed(digits) : 'n/a (no rows yet)');
  const year50k = { rawHeldGB: gb(50_000 * rawPerNodeDay * config.rawRetentionDays), rollupsPerYearGB: gb(50_000 * rollupPerNodeDay * 365) };

  const warm = rss.filter((s) => s.t >= Math.min(120, DURATION_S / 3));
  const growth = (k: 'a' | 'b') => (warm.length >= 2 ? (warm.at(-1)![k] ?? 0) - (warm[0][k] ?? 0) : NaN);
  const p99 = pct(latencies, 0.99);
  const maxTick = allTicks.at(-1) ?? NaN;
  const cross = live.a.cross + live.b.cross;
  const result = {
    nodes: NODES,
    durationS: DURATION_S,
    posts: reporter.counts.posts,
    statuses,
    perInstance,
    reportsAccepted: accepted,
    rowsStored: found,
    reportsLost: lost,
    latencyMs: { p50: r1(pct(latencies, 0.5)), p95: r1(pct(latencies, 0.95)), p99: r1(p99), max: r1(latencies.at(-1) ?? NaN) },
    silenceCheckTicks: {
      leaderTicks: allTicks.length,
      p50Ms: r1(pct(allTicks, 0.5)),
      maxMs: r1(maxTick),
      over2s: allTicks.filter((t) => t >= TICK_TARGET_MS).length,
    },
    rssMb: rss,
    rssGrowthAfterWarmupMb: { a: growth('a'), b: growth('b') },
    liveEvents: live,
    stateEventsOnA: stateCounts,
    powerCuts: reporter.counts.powerCuts,
    flakyDrops: reporter.counts.flakyDrops,
    storage: {
      rawBytes,
      rawRows: Number(counts.raw),
      rawBytesPerReport: Math.round(rawPerReport),
      rawBytesPerNodePerDay: Math.round(rawPerNodeDay),
      rollupBytes,
      rollupRows: Number(counts.rollups),
      rollupBytesPerRow: Math.round(rollupPerRow),
      rollupBytesPerNodePerDay: Math.round(rollupPerNodeDay),
      rawRetentionDays: config.rawRetentionDays,
      rollupRetentionDays: config.rollupRetentionDays,
      fiftyThousandNodes: year50k,
    },
  };
  const verdict = (ok: boolean) => (ok ? 'met' : 'MISSED');
  console.log('');
  console.log(
    `reports: ${accepted} accepted (202), ${found} rows stored — ${lost === 0 ? 'nothing lost' : `${lost} LOST`}; ` +
      `statuses ${JSON.stringify(statuses)}; ` +
      `posts per instance ${JSON.stringify(perInstance)}`,
  );
  const l = result.latencyMs;
  console.log(
    `latency through the proxy: p50 ${l.p50} ms, p95 ${l.p95} ms, p99 ${l.p99} ms, max ${l.max} ms ` +
      `(target p99 < ${P99_TARGET_MS} ms: ${verdict(p99 < P99_TARGET_MS)})`,
  );
  const st = result.silenceCheckTicks;
  console.log(
    `silence check: ${allTicks.length} leader ticks (a ${ticks.a.length}, b ${ticks.b.length}), p50 ${st.p50Ms} ms, max ${st.maxMs} ms ` +
      `(target every tick < ${TICK_TARGET_MS} ms: ${verdict(result.silenceCheckTicks.over2s === 0 && allTicks.length > 0)})`,
  );
  console.log(`memory (RSS MB every ${SAMPLE_S} s) a: ${rss.map((s) => s.a).join(' ')}`);
  console.log(`memory (RSS MB every ${SAMPLE_S} s) b: ${rss.map((s) => s.b).join(' ')}`);
  console.log(`memory growth after warm-up: a ${growth('a')} MB, b ${growth('b')} MB`);
  console.log(
    `live events: socket on a got ${live.a.cross} figures events for reports ingested by b (${live.a.local} local); ` +
      `socket on b got ${live.b.cross} for reports ingested by a (${live.b.local} local); ` +
      `state events a ${live.a.states}, b ${live.b.states} ${JSON.stringify(stateCounts)} ` +
      `(${verdict(live.a.cross > 0 && live.b.cross > 0)})`,
  );
  for (const [kind, p] of reporter.problems) console.log(`problem ${kind}: ${p.count} times, first: ${p.example}`);
  console.log(`faults: ${reporter.counts.powerCuts} power cuts, ${reporter.counts.flakyDrops} flaky drop-outs`);
  console.log(
    `storage: raw ${shown(rawPerReport)} B per report → ${shown(rawPerNodeDay / 1e6, 2)} MB per node per day at ${TOWN_REPORT_INTERVAL_S} s; ` +
      `roll-ups ${shown(rollupPerRow)} B per row → ${shown(rollupPerNodeDay / 1e3, 1)} kB per node per day (5-min + hourly)`,
  );
  console.log(
    `50,000 nodes: raw held (${config.rawRetentionDays} days) ${year50k.rawHeldGB} GB; ` +
      `roll-ups add ${year50k.rollupsPerYearGB} GB a year (kept ${config.rollupRetentionDays} days)`,
  );
  if (cross === 0) console.log('note: no event crossed instances');
  console.log(JSON.stringify({ bench: 'town', ...result }));
  process.exitCode = 0;
} finally {
  await reporter?.stop(1000);
  sockets.forEach((s) => s.close());
  await Promise.allSettled(started.reverse().map((s) => s.stop()));
  await sequelize.close();
}
process.exit(process.exitCode ?? 1);
