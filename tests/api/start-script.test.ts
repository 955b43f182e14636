import { execFile, spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort } from '../helpers/mailFake';

// The real docker-free-scripts/start.sh, on ports and in a data folder of this test's own (never the
// demo's 4300/5433/1025/1080 or .data): a signal to the script's pid alone (as `kill PID` or a service
// manager sends it, not to its process group) stops everything it started, in order, and frees its ports.
// Each start runs migrations, loads the demo's inventory (no history), and starts the mail fake, the
// compiled app and the simulator: about a minute on a busy machine.

const run = promisify(execFile);
const READY_MS = 300_000;
const STOP_MS = 60_000;

let dataDir = '';
const ports = { app: 0, pg: 0, smtp: 0, mailWeb: 0 };

/** Bash with the scripts' own helpers loaded, on this test's data folder. */
async function lib(script: string) {
  const { stdout } = await run(
    'bash',
    ['-c', `set -euo pipefail; source docker-free-scripts/lib/init.sh "$1"; ensure_postgres_server; ${script}`, 'lib', dataDir],
    {
      encoding: 'utf8',
      timeout: 120_000,
    },
  );
  return stdout.trim();
}

interface Started {
  child: ChildProcess;
  output: () => string;
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
}

function startScript(): Started {
  // A clean environment: nothing of the test run's own database, mail fake or NODE_ENV leaks in.
  const env: Record<string, string> = {
    PATH: process.env.PATH ?? '/usr/bin:/bin',
    HOME: process.env.HOME ?? '/root',
    LANG: 'C.UTF-8',
    PARAPET_DATA: dataDir,
    PARAPET_DEMO_HISTORY: '0',
    HOST: '127.0.0.1',
    PORT: String(ports.app),
    PARAPET_PG_PORT: String(ports.pg),
    PARAPET_SMTP_PORT: String(ports.smtp),
    PARAPET_MAIL_WEB_PORT: String(ports.mailWeb),
  };
  let output = '';
  const child = spawn('bash', ['docker-free-scripts/start.sh'], { env, stdio: ['ignore', 'pipe', 'pipe'] });
  child.stdout!.on('data', (d) => (output += d));
  child.stderr!.on('data', (d) => (output += d));
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    child.once('exit', (code, signal) => resolve({ code, signal })),
  );
  return { child, output: () => output, exited };
}

async function until<T>(what: string, ms: number, check: () => Promise<T | undefined> | T | undefined, log: () => string): Promise<T> {
  const deadline = Date.now() + ms;
  for (;;) {
    const value = await check();
    if (value !== undefined) return value;
    if (Date.now() > deadline) throw new Error(`${what}: not within ${ms / 1000} s; output so far:\n${log()}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

const portAnswers = (port: number) =>
  new Promise<boolean>((resolve) => {
    const socket = net.connect({ host: '127.0.0.1', port });
    socket.once('connect', () => (socket.destroy(), resolve(true)));
    socket.once('error', () => resolve(false));
  });

/** Parent, process group and start time of a process, or null when it is gone (a zombie counts as gone). */
function procStat(pid: number): { pgid: number; ppid: number; start: string } | null {
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    if (fields[0] === 'Z') return null;
    return { ppid: Number(fields[1]), pgid: Number(fields[2]), start: fields[19] };
  } catch {
    return null;
  }
}

/** Every process of the services start.sh recorded: each service's process group, and the postmaster with its children. */
function serviceProcesses(): { pid: number; start: string; what: string }[] {
  const leaders = new Map<number, string>();
  for (const name of ['app', 'simulator', 'maildev']) {
    const file = path.join(dataDir, `${name}.pid`);
    if (fs.existsSync(file)) leaders.set(Number(fs.readFileSync(file, 'utf8').split(' ')[0]), name);
  }
  const postmasterFile = path.join(dataDir, 'pg', 'postmaster.pid');
  const postmaster = fs.existsSync(postmasterFile) ? Number(fs.readFileSync(postmasterFile, 'utf8').split('\n')[0]) : 0;
  const found: { pid: number; start: string; what: string }[] = [];
  for (const entry of fs.readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    const pid = Number(entry);
    const stat = procStat(pid);
    if (!stat) continue;
    if (leaders.has(stat.pgid)) found.push({ pid, start: stat.start, what: leaders.get(stat.pgid)! });
    else if (postmaster && (pid === postmaster || stat.ppid === postmaster)) found.push({ pid, start: stat.start, what: 'postgres' });
  }
  return found;
}

/** start.sh's children and their children, at this moment (a step in progress, the simulator's npm, sleep). */
function descendants(root: number): { pid: number; start: string; what: string }[] {
  const children = new Map<number, { pid: number; start: string }[]>();
  for (const entry of fs.readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    const stat = procStat(Number(entry));
    if (!stat) continue;
    const list = children.get(stat.ppid) ?? [];
    list.push({ pid: Number(entry), start: stat.start });
    children.set(stat.ppid, list);
  }
  const found: { pid: number; start: string; what: string }[] = [];
  const walk = (pid: number) => {
    for (const c of children.get(pid) ?? []) {
      found.push({ ...c, what: 'child of start.sh' });
      walk(c.pid);
    }
  };
  walk(root);
  return found;
}

const stillRunning = (procs: { pid: number; start: string; what: string }[]) => procs.filter((p) => procStat(p.pid)?.start === p.start);

async function startAndWaitReady() {
  const started = startScript();
  await until('start.sh ready', READY_MS, () => (started.output().includes('Press Ctrl-C to stop.') ? true : undefined), started.output);
  // The simulator is the last service started: wait until its process group is up.
  await until('the simulator running', 30_000, () => (serviceProcesses().some((p) => p.what === 'simulator') ? true : undefined), started.output);
  const health = await fetch(`http://127.0.0.1:${ports.app}/api/health`);
  expect(health.status).toBe(200);
  return started;
}

/** Signal start.sh's own pid, then: it exits with 128+signal, and every service process is gone and every port free in bounded time. */
async function stopWith(started: Started, signal: 'SIGTERM' | 'SIGINT', expectedCode: number, expectPgStopped = true) {
  const scriptPid = started.child.pid!;
  const procs = [...serviceProcesses(), ...descendants(scriptPid)];
  const kinds = new Set(procs.map((p) => p.what));
  expect([...kinds].sort()).toEqual(['app', 'child of start.sh', 'maildev', 'postgres', 'simulator']);
  const before = Date.now();
  process.kill(scriptPid, signal); // the script's pid only, not its process group
  const exit = await Promise.race([started.exited, new Promise<null>((r) => setTimeout(() => r(null), STOP_MS))]);
  expect(exit, `start.sh did not exit within ${STOP_MS / 1000} s of ${signal}:\n${started.output()}`).not.toBeNull();
  expect(exit!.code).toBe(expectedCode);
  const left = await until(
    'every service process gone',
    15_000,
    () => {
      const alive = stillRunning(procs).filter((p) => expectPgStopped || p.what !== 'postgres');
      return alive.length === 0 ? alive : undefined;
    },
    () => JSON.stringify(stillRunning(procs)),
  );
  expect(left).toEqual([]);
  const busy: number[] = [];
  for (const port of expectPgStopped ? [ports.app, ports.pg, ports.smtp, ports.mailWeb] : [ports.app, ports.smtp, ports.mailWeb]) {
    if (await portAnswers(port)) busy.push(port);
  }
  expect(busy, 'ports still answering after start.sh stopped').toEqual([]);
  const checked = procs.filter((p) => expectPgStopped || p.what !== 'postgres').length;
  console.log(`start-script: ${signal} to start.sh → exited ${exit!.code}, ${checked} processes gone within ${Date.now() - before} ms`);
  // In this order: the app, the simulator, the mail fake, PostgreSQL (fast shutdown), each waited for.
  const out = started.output();
  const at = (s: string) => out.indexOf(s);
  expect(at('stopping app (pid')).toBeGreaterThan(0);
  expect(at('stopping simulator (pid')).toBeGreaterThan(at('stopping app (pid'));
  expect(at('stopping mail fake (pid')).toBeGreaterThan(at('stopping simulator (pid'));
  if (expectPgStopped) expect(at('stopping PostgreSQL (pg_ctl stop -m fast)')).toBeGreaterThan(at('stopping mail fake (pid'));
  else expect(at('stopping PostgreSQL')).toBe(-1);
  expect(out.trimEnd().endsWith('[parapet] stopped')).toBe(true);
  expect(fs.existsSync(path.join(dataDir, 'start.pid'))).toBe(false);
}

describe('start.sh stops what it started', () => {
  beforeAll(async () => {
    // Under the system temp folder, open to the cluster owner (postgres when root) to traverse.
    dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'parapet-start-'));
    fs.chmodSync(dataDir, 0o755);
    ports.app = await freePort();
    ports.pg = await freePort();
    ports.smtp = await freePort();
    ports.mailWeb = await freePort();
    for (const p of Object.values(ports)) expect([4300, 5433, 1025, 1080]).not.toContain(p);
  });

  afterAll(async () => {
    if (!dataDir) return;
    // Only this test's own processes: those its pid files and its cluster name.
    for (const p of serviceProcesses()) if (p.what !== 'postgres') process.kill(p.pid, 'SIGKILL');
    await lib('pg_stop_cluster "$PARAPET_DATA_DIR/pg" immediate').catch(() => undefined);
    fs.rmSync(dataDir, { recursive: true, force: true });
  }, 120_000);

  it(
    'SIGTERM to its pid alone stops the app, the simulator, the mail fake and PostgreSQL, frees the ports and exits 143',
    async () => {
      const started = await startAndWaitReady();
      await stopWith(started, 'SIGTERM', 143);
      expect(fs.readFileSync(path.join(dataDir, 'postgres.log'), 'utf8')).toMatch(/received fast shutdown request/);
    },
    READY_MS + 120_000,
  );

  it(
    'a second start on the same folder starts cleanly, and SIGINT (Ctrl-C) stops it the same way with 130',
    async () => {
      const started = await startAndWaitReady();
      expect(started.output()).not.toMatch(/left running by an earlier start|stale/);
      await stopWith(started, 'SIGINT', 130);
    },
    READY_MS + 120_000,
  );

  it(
    'a cluster that was already running when it began is used and left running',
    async () => {
      await lib(`pg_start_cluster "$PARAPET_DATA_DIR/pg" ${ports.pg} "$PARAPET_DATA_DIR/postgres.log" >&2`);
      const postmaster = Number(fs.readFileSync(path.join(dataDir, 'pg', 'postmaster.pid'), 'utf8').split('\n')[0]);
      const started = await startAndWaitReady();
      expect(started.output()).toMatch(/PostgreSQL is already running .*leaving it running on exit/);
      await stopWith(started, 'SIGTERM', 143, false);
      expect(procStat(postmaster)).not.toBeNull();
      expect(await portAnswers(ports.pg)).toBe(true);
      await lib('pg_stop_cluster "$PARAPET_DATA_DIR/pg" fast');
      expect(await portAnswers(ports.pg)).toBe(false);
    },
    READY_MS + 120_000,
  );

  it(
    'SIGTERM during a start-up step (migrations) stops the step and the cluster at once, and exits 143',
    async () => {
      const started = startScript();
      await until('the migrate step', READY_MS, () => (started.output().includes('npm run migrate') ? true : undefined), started.output);
      const scriptPid = started.child.pid!;
      await until('the step running as a child', 30_000, () => (descendants(scriptPid).length > 0 ? true : undefined), started.output);
      const procs = [...descendants(scriptPid), ...serviceProcesses()];
      expect(procs.some((p) => p.what === 'postgres')).toBe(true);
      const before = Date.now();
      process.kill(scriptPid, 'SIGTERM');
      const exit = await Promise.race([started.exited, new Promise<null>((r) => setTimeout(() => r(null), STOP_MS))]);
      expect(exit, `start.sh did not exit within ${STOP_MS / 1000} s:\n${started.output()}`).not.toBeNull();
      expect(exit!.code).toBe(143);
      await until(
        'every process gone',
        15_000,
        () => (stillRunning(procs).length === 0 ? true : undefined),
        () => JSON.stringify(stillRunning(procs)),
      );
      for (const port of Object.values(ports)) expect(await portAnswers(port)).toBe(false);
      expect(started.output()).toMatch(/stopping PostgreSQL \(pg_ctl stop -m fast\)/);
      expect(started.output()).not.toMatch(/Press Ctrl-C/);
      console.log(`start-script: SIGTERM during migrations → exited 143, ${procs.length} processes gone within ${Date.now() - before} ms`);
    },
    READY_MS + 120_000,
  );
});
