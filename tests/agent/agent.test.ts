import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { createServer, type IncomingHttpHeaders, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { execFile, execFileSync } from 'node:child_process';
import { chmodSync, copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

// The heartbeat agent runs on the routers; here it runs against fake /proc, release file
// and `iw` output, and posts to a recording HTTP server on 127.0.0.1.

const repoRoot = resolve(fileURLToPath(new URL('.', import.meta.url)), '../..');
const agentPath = join(repoRoot, 'public/agent/parapet-agent.sh');
const fixtures = join(repoRoot, 'tests/agent/fixtures');
const TOKEN = 'pnt_3f9c2a7e51b84d06a1c9e2f7b6d04a18';
const ISO_UTC = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}Z$/;

function onPath(cmd: string): boolean {
  try {
    execFileSync('sh', ['-c', `command -v ${cmd}`], { stdio: 'ignore' });
    return true;
  } catch {
    return false;
  }
}

// Figures the agent must read from the fixtures, in `iw dev` order (phy#1 is listed first).
const expectedRadios = [
  {
    iface: 'wlan1',
    channel: 6,
    channelWidthMHz: 20,
    ssid: 'Larkhollow Free',
    mac: '0a:6b:21:4c:80:13', // "addr" of wlan1 in `iw dev`
    signalDbm: -71, // weakest of the three stations (-48, -71, -59); not its "signal avg" -45
    noiseDbm: -91, // the survey entry marked [in use] (2437 MHz), not its neighbours' -89 / -90
    txRateMbps: 43.3, // rates of that weakest station
    rxRateMbps: 28.9,
    clients: 3,
  },
  {
    iface: 'wlan0',
    channel: 36,
    channelWidthMHz: 40,
    ssid: 'larkhollow-backhaul',
    mac: '0a:6b:21:4c:80:12', // "addr" of wlan0 in `iw dev`
    signalDbm: -61, // "signal:" line; "signal avg:" says -58 and must be ignored
    noiseDbm: -95,
    txRateMbps: 300,
    rxRateMbps: 270,
    peerMac: '06:1c:4e:90:3b:d2',
  },
];

// ---- the recording server ------------------------------------------------------------
type Answer = 401 | 500 | 'close';
interface Recorded {
  method: string;
  url: string;
  headers: IncomingHttpHeaders;
  body: string;
  status: number | 'closed';
}

class FakeServer {
  requests: Recorded[] = [];
  private answers: Answer[] = [];
  /** Like the real server, refuse (400) any request holding the report with this seq. */
  invalidSeq: number | null = null;
  private server: Server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const body = Buffer.concat(chunks).toString('utf8');
      const recorded: Recorded = { method: req.method ?? '', url: req.url ?? '', headers: req.headers, body, status: 'closed' };
      this.requests.push(recorded);
      const reply = (status: number, payload: unknown) => {
        recorded.status = status;
        res.writeHead(status, { 'Content-Type': 'application/json' });
        res.end(JSON.stringify(payload));
      };
      const answer = this.answers.shift();
      if (answer === 'close') req.socket.destroy();
      else if (answer === 401) reply(401, { error: { code: 'invalid_token', message: 'The node token is not valid.' } });
      else if (answer === 500) reply(500, { error: { code: 'internal', message: 'Something went wrong on our side.' } });
      else {
        // once the queued answers run out, judge the reports as the real server would
        const parsed = JSON.parse(body) as { seq?: number; reports?: { seq: number }[] };
        const reports = parsed.reports ?? [parsed];
        const bad = reports.findIndex((r) => r.seq === this.invalidSeq);
        if (bad < 0) reply(202, { accepted: reports.length, duplicates: 0 });
        else
          reply(400, {
            error: {
              code: 'invalid_report',
              message: 'The heartbeat report is not valid.',
              details: [{ path: `${parsed.reports ? `reports.${bad}.` : ''}uptimeS`, message: 'must be a whole number' }],
            },
          });
      }
    });
  });

  /** Answers for the next requests, in order; after them the reports are judged. */
  answer(...answers: Answer[]) {
    this.answers = answers;
  }
  reset() {
    this.requests = [];
    this.answers = [];
    this.invalidSeq = null;
  }
  async start(): Promise<string> {
    await new Promise<void>((done) => this.server.listen(0, '127.0.0.1', done));
    return `http://127.0.0.1:${(this.server.address() as AddressInfo).port}`;
  }
  async stop() {
    this.server.closeAllConnections();
    await new Promise<void>((done) => this.server.close(() => done()));
  }
}

const bodyOf = (r: Recorded) => JSON.parse(r.body) as Record<string, unknown>;
const seqsOf = (r: Recorded) => (bodyOf(r).reports as { seq: number }[]).map((x) => x.seq);
/** Seqs in a single report or a batch. */
const seqsIn = (r: Recorded) => ('reports' in bodyOf(r) ? seqsOf(r) : [bodyOf(r).seq as number]);

// ---- the shells and HTTP clients the agent must work with -----------------------------
const scratch = mkdtempSync(join(tmpdir(), 'parapet-agent-test-'));
const fakeIw = join(scratch, 'iw');
copyFileSync(join(fixtures, 'iw'), fakeIw);
chmodSync(fakeIw, 0o755); // a checkout may drop the executable bit

// Only busybox applets on PATH, so the script cannot lean on GNU tools there.
const busyboxBin = join(scratch, 'busybox-bin');
const busyboxApplets = ['sh', 'awk', 'sed', 'head', 'tail', 'cat', 'cp', 'mv', 'rm', 'mkdir', 'mktemp', 'date', 'uname', 'sleep', 'wget'];
const hasBusybox = onPath('busybox');
if (hasBusybox) {
  mkdirSync(busyboxBin);
  const busybox = execFileSync('sh', ['-c', 'command -v busybox'], { encoding: 'utf8' }).trim();
  for (const applet of busyboxApplets) symlinkSync(busybox, join(busyboxBin, applet));
}

interface Runtime {
  name: string;
  shell: string[];
  http: 'curl' | 'wget' | 'auto';
  path: string;
  userAgent: RegExp; // proves which HTTP client actually sent the request
  readsErrorBody: boolean; // busybox wget stops at a 4xx status line and never reads the body
  skip?: string;
}
const systemPath = process.env.PATH ?? '/usr/bin:/bin';
const runtimes: Runtime[] = [
  {
    name: 'dash with curl',
    shell: ['dash'],
    http: 'curl',
    path: systemPath,
    userAgent: /^curl\//,
    readsErrorBody: true,
    skip: !onPath('dash') ? 'dash is not installed (apt-get install dash)' : !onPath('curl') ? 'curl is not installed (apt-get install curl)' : undefined,
  },
  {
    name: 'dash with GNU wget',
    shell: ['dash'],
    http: 'wget',
    path: systemPath,
    userAgent: /^Wget\/\d/,
    readsErrorBody: true,
    skip: !onPath('dash') ? 'dash is not installed (apt-get install dash)' : !onPath('wget') ? 'wget is not installed (apt-get install wget)' : undefined,
  },
  {
    // PARAPET_HTTP=auto with no curl on PATH must fall back to (busybox) wget
    name: 'busybox ash with busybox wget',
    shell: [join(busyboxBin, 'sh')],
    http: 'auto',
    path: busyboxBin,
    userAgent: /^Wget$/,
    readsErrorBody: false,
    skip: hasBusybox ? undefined : 'busybox is not installed (apt-get install busybox)',
  },
];

afterAll(() => rmSync(scratch, { recursive: true, force: true }));

interface Run {
  code: number;
  stderr: string;
}

describe('parapet-agent.sh is portable POSIX sh', () => {
  it.skipIf(!onPath('dash'))('parses under dash (sh -n)', () => {
    expect(() => execFileSync('dash', ['-n', agentPath], { stdio: 'pipe' })).not.toThrow();
  });
  it.skipIf(!hasBusybox)('parses under busybox ash (sh -n)', () => {
    expect(() => execFileSync('busybox', ['sh', '-n', agentPath], { stdio: 'pipe' })).not.toThrow();
  });
  // test.sh installs shellcheck, so CI never skips this; a developer's bare `vitest` run may.
  it.skipIf(!onPath('shellcheck') && !process.env.CI)('passes shellcheck -s sh (never skipped in CI)', () => {
    const out = (() => {
      try {
        return execFileSync('shellcheck', ['-s', 'sh', agentPath, join(fixtures, 'iw')], { encoding: 'utf8' });
      } catch (e) {
        return String((e as { stdout?: string }).stdout ?? e);
      }
    })();
    expect(out).toBe('');
  });
  it('keeps each provisioning placeholder line exactly once', () => {
    const script = readFileSync(agentPath, 'utf8');
    expect(script.split('\n').filter((l) => l === 'PARAPET_URL="${PARAPET_URL:-__PARAPET_URL__}"')).toHaveLength(1);
    expect(script.split('\n').filter((l) => l === 'PARAPET_TOKEN="${PARAPET_TOKEN:-__PARAPET_TOKEN__}"')).toHaveLength(1);
    expect(script.split('__PARAPET_URL__')).toHaveLength(2);
    expect(script.split('__PARAPET_TOKEN__')).toHaveLength(2);
  });
});

for (const rt of runtimes) {
  describe.skipIf(Boolean(rt.skip))(`parapet-agent.sh under ${rt.name}${rt.skip ? ` — skipped: ${rt.skip}` : ''}`, { timeout: 30_000 }, () => {
    const server = new FakeServer();
    let baseUrl = '';
    let stateDir = '';
    const bufferFile = () => join(stateDir, 'buffer.jsonl');
    const bufferedSeqs = () =>
      existsSync(bufferFile())
        ? readFileSync(bufferFile(), 'utf8')
            .split('\n')
            .filter(Boolean)
            .map((l) => (JSON.parse(l) as { seq: number }).seq)
        : [];

    const env = (extra: Record<string, string | undefined> = {}) => {
      const all: Record<string, string | undefined> = {
        PATH: rt.path,
        TMPDIR: scratch,
        PARAPET_URL: baseUrl,
        PARAPET_TOKEN: TOKEN,
        PARAPET_STATE_DIR: stateDir,
        PARAPET_PROC: join(fixtures, 'proc'),
        PARAPET_IW: fakeIw,
        PARAPET_OS_RELEASE: join(fixtures, 'os-release'),
        PARAPET_VERSION_FILE: join(fixtures, 'no-version-file'),
        PARAPET_HTTP: rt.http,
        PARAPET_CONFIG: join(stateDir, 'no-such-agent.conf'), // keep this machine's /etc out
        PARAPET_TIMEOUT_S: '5',
        ...extra,
      };
      return Object.fromEntries(Object.entries(all).filter(([, v]) => v !== undefined)) as Record<string, string>;
    };
    const run = (extra: Record<string, string | undefined> = {}, script = agentPath) =>
      new Promise<Run>((done) => {
        execFile(rt.shell[0], [...rt.shell.slice(1), script, '--once'], { env: env(extra), timeout: 20_000 }, (err, _stdout, stderr) => {
          const code = err ? (typeof err.code === 'number' ? err.code : -1) : 0;
          done({ code, stderr });
        });
      });

    beforeAll(async () => {
      baseUrl = await server.start();
    });
    afterAll(() => server.stop());
    beforeEach(() => {
      server.reset();
      stateDir = mkdtempSync(join(scratch, 'state-'));
    });
    afterEach(() => rmSync(stateDir, { recursive: true, force: true }));

    it('posts one report to /api/v1/heartbeats with the bearer token and the figures read from /proc and iw', async () => {
      const before = Date.now();
      const result = await run();
      expect(result).toEqual({ code: 0, stderr: '' });
      expect(server.requests).toHaveLength(1);
      const [req] = server.requests;
      expect(req.method).toBe('POST');
      expect(req.url).toBe('/api/v1/heartbeats');
      expect(req.headers.authorization).toBe(`Bearer ${TOKEN}`);
      expect(req.headers['content-type']).toBe('application/json');
      expect(req.headers['user-agent']).toMatch(rt.userAgent);
      expect(bodyOf(req)).toEqual({
        seq: 1,
        bootId: '5c0ffee1-2d3e-4f50-8a6b-7c8d9e0f1a2b', // proc/sys/kernel/random/boot_id
        sentAt: expect.stringMatching(ISO_UTC),
        uptimeS: 86523, // 86523.41 in uptime, whole seconds
        load1: 0.42,
        memFreeKb: 48212, // MemAvailable, preferred over MemFree (21340)
        firmware: 'Tilecrest 5.1.2 (r1042-b7c9)', // PRETTY_NAME of the fixture's os-release
        radios: expectedRadios,
      });
      const sentAtMs = Date.parse(bodyOf(req).sentAt as string);
      expect(sentAtMs).toBeGreaterThanOrEqual(Math.floor(before / 1000) * 1000);
      expect(sentAtMs).toBeLessThanOrEqual(Date.now());
      expect(bufferedSeqs()).toEqual([]);
    });

    it('numbers reports 1, 2, 3 across runs and carries on from the stored seq after a restart', async () => {
      for (let i = 0; i < 3; i++) expect((await run()).code).toBe(0);
      expect(server.requests.map((r) => bodyOf(r).seq)).toEqual([1, 2, 3]);
      expect(readFileSync(join(stateDir, 'seq'), 'utf8').trim()).toBe('3');
      writeFileSync(join(stateDir, 'seq'), '41\n'); // as a long-running agent left it before a reboot
      expect((await run()).code).toBe(0);
      expect(bodyOf(server.requests[3]).seq).toBe(42);
    });

    it('after a reboot (counter gone with /tmp, a new boot id) counts from 1 again under the new boot id', async () => {
      expect((await run()).code).toBe(0);
      const rebooted = join(stateDir, 'proc-after-reboot');
      mkdirSync(join(rebooted, 'sys/kernel/random'), { recursive: true });
      writeFileSync(join(rebooted, 'sys/kernel/random/boot_id'), '9a8b7c6d-1111-4222-8333-444455556666\n');
      rmSync(join(stateDir, 'seq'));
      expect((await run({ PARAPET_PROC: rebooted })).code).toBe(0);
      expect(server.requests.map((r) => [bodyOf(r).bootId, bodyOf(r).seq])).toEqual([
        ['5c0ffee1-2d3e-4f50-8a6b-7c8d9e0f1a2b', 1],
        ['9a8b7c6d-1111-4222-8333-444455556666', 1],
      ]);
    });

    it('leaves out a boot id that is not one (never sends what the server would refuse)', async () => {
      const odd = join(stateDir, 'proc-odd');
      mkdirSync(join(odd, 'sys/kernel/random'), { recursive: true });
      writeFileSync(join(odd, 'sys/kernel/random/boot_id'), 'not "a" boot id\n');
      expect((await run({ PARAPET_PROC: odd })).code).toBe(0);
      expect(bodyOf(server.requests[0])).not.toHaveProperty('bootId');
    });

    it('buffers a report the server fails on (500) and sends it with the next one as a batch in seq order', async () => {
      server.answer(500);
      const failed = await run();
      expect(failed.code).toBe(1);
      expect(failed.stderr).toMatch(/HTTP 500/);
      expect(bufferedSeqs()).toEqual([1]);

      expect((await run()).code).toBe(0);
      expect(server.requests).toHaveLength(2);
      const batch = bodyOf(server.requests[1]) as { reports: Record<string, unknown>[] };
      expect(Object.keys(batch)).toEqual(['reports']);
      expect(seqsOf(server.requests[1])).toEqual([1, 2]);
      expect(batch.reports[0]).toEqual(bodyOf(server.requests[0])); // resent exactly as first built
      expect(batch.reports[1].radios).toEqual(expectedRadios);
      expect(bufferedSeqs()).toEqual([]);
    });

    it('buffers a report when the connection drops without an answer', async () => {
      server.answer('close');
      const failed = await run();
      expect(failed.code).toBe(1);
      expect(failed.stderr).toMatch(/could not reach/);
      expect(bufferedSeqs()).toEqual([1]);
      expect((await run()).code).toBe(0);
      expect(seqsOf(server.requests[1])).toEqual([1, 2]);
      expect(bufferedSeqs()).toEqual([]);
    });

    it('keeps only the newest PARAPET_BUFFER_MAX reports while the server is down', async () => {
      server.answer(500, 500, 500, 500, 500);
      for (let i = 0; i < 5; i++) expect((await run({ PARAPET_BUFFER_MAX: '3' })).code).toBe(1);
      expect(bufferedSeqs()).toEqual([3, 4, 5]);
      expect((await run({ PARAPET_BUFFER_MAX: '3' })).code).toBe(0);
      expect(seqsOf(server.requests[5])).toEqual([3, 4, 5, 6]);
      expect(bufferedSeqs()).toEqual([]);
    });

    it('splits a backlog larger than the server’s 500-report limit into several batches', async () => {
      const old = Array.from({ length: 520 }, (_, i) => JSON.stringify({ seq: i + 1, sentAt: '2026-03-02T10:00:00Z', radios: [] }));
      writeFileSync(bufferFile(), `${old.join('\n')}\n`);
      writeFileSync(join(stateDir, 'seq'), '520\n');
      expect((await run({ PARAPET_BUFFER_MAX: '1000' })).code).toBe(0);
      expect(server.requests).toHaveLength(2);
      const first = seqsOf(server.requests[0]);
      expect(first).toHaveLength(500);
      expect(first[0]).toBe(1);
      expect(first[499]).toBe(500);
      expect(seqsOf(server.requests[1])).toEqual(Array.from({ length: 21 }, (_, i) => 501 + i));
      expect(bufferedSeqs()).toEqual([]);
    });

    it('on 401 says the token is wrong or revoked and does not buffer the report', async () => {
      server.answer(401);
      const refused = await run();
      expect(refused.code).toBe(2);
      expect(refused.stderr).toMatch(/token.*wrong or was revoked/);
      expect(server.requests).toHaveLength(1);
      expect(bufferedSeqs()).toEqual([]);
    });

    it('on 401 keeps reports buffered earlier (they failed for another reason) but not the new one', async () => {
      server.answer(500, 401);
      expect((await run()).code).toBe(1);
      expect((await run()).code).toBe(2);
      expect(seqsOf(server.requests[1])).toEqual([1, 2]);
      expect(bufferedSeqs()).toEqual([1]);
    });

    it('on 400 logs the server’s message and drops the report', async () => {
      server.invalidSeq = 1;
      const refused = await run();
      expect(refused.code).toBe(2);
      expect(refused.stderr).toMatch(
        rt.readsErrorBody ? /seq 1 \(HTTP 400\), dropping it: .*The heartbeat report is not valid\..*uptimeS/ : /seq 1 \(HTTP 400\), dropping it/,
      );
      expect(bufferedSeqs()).toEqual([]);
      expect((await run()).code).toBe(0);
      expect(server.requests.map((r) => [seqsIn(r), r.status])).toEqual([
        [[1], 400],
        [[2], 202],
      ]);
    });

    it('on 400 for a batch drops only the report the server refuses and delivers the rest in the same run', async () => {
      server.answer(500, 500);
      await run();
      await run();
      server.invalidSeq = 2;
      const result = await run();
      expect(result.code).toBe(2);
      expect(result.stderr).toMatch(/refused report seq 2 \(HTTP 400\)/);
      expect(bufferedSeqs()).toEqual([]);
      const accepted = server.requests.filter((r) => r.status === 202).flatMap(seqsIn);
      expect(accepted).toEqual([1, 3]);
      // with the error body the agent knows which report to drop (reports.1);
      // without it, it halves the batch until the bad report stands alone
      expect(server.requests.slice(2).map((r) => [seqsIn(r), r.status])).toEqual(
        rt.readsErrorBody
          ? [
              [[1, 2, 3], 400],
              [[1, 3], 202],
            ]
          : [
              [[1, 2, 3], 400],
              [[1], 202],
              [[2], 400],
              [[3], 202],
            ],
      );
    });

    it('escapes SSIDs for JSON: quotes, backslashes, control characters and UTF-8 bytes', async () => {
      const result = await run({
        // as iw prints them: non-printable bytes and backslash as \xNN, quotes as they are
        FAKE_IW_AP_SSID: 'Caf\\xc3\\xa9 "Roof" \\x5c north\\x09end',
        // an older iw that printed the bytes raw
        FAKE_IW_BACKHAUL_SSID: 'back\\slash"quote',
      });
      expect(result.code).toBe(0);
      const raw = server.requests[0].body;
      expect(() => JSON.parse(raw)).not.toThrow();
      const radios = bodyOf(server.requests[0]).radios as { ssid: string }[];
      expect(radios.map((r) => r.ssid)).toEqual(['Café "Roof" \\ north\tend', 'back\\slash"quote']);
    });

    it('names the firmware from os-release NAME and VERSION_ID, and takes only the version from the version file', async () => {
      const osRelease = join(stateDir, 'os-release');
      writeFileSync(osRelease, 'NAME=\'Tilecrest\'\nID=tilecrest\nVERSION_ID="5.0.4"\n');
      expect((await run({ PARAPET_OS_RELEASE: osRelease })).code).toBe(0);
      expect(bodyOf(server.requests[0]).firmware).toBe('Tilecrest 5.0.4');

      writeFileSync(osRelease, 'NAME="Tilecrest"\nID=tilecrest\n');
      const versionFile = join(stateDir, 'version');
      writeFileSync(versionFile, '  5.1.0-rc2  \nsecond line is ignored\n');
      expect((await run({ PARAPET_OS_RELEASE: osRelease, PARAPET_VERSION_FILE: versionFile })).code).toBe(0);
      expect(bodyOf(server.requests[1]).firmware).toBe('Tilecrest 5.1.0-rc2');

      // A version file alone names nothing: without os-release the agent reports the kernel.
      expect((await run({ PARAPET_OS_RELEASE: join(stateDir, 'absent'), PARAPET_VERSION_FILE: versionFile })).code).toBe(0);
      expect(bodyOf(server.requests[2]).firmware).toBe(execFileSync('uname', ['-r'], { encoding: 'utf8' }).trim());
    });

    it('leaves out what it cannot read instead of sending invalid values', async () => {
      const emptyProc = join(stateDir, 'proc');
      mkdirSync(emptyProc);
      const result = await run({
        PARAPET_PROC: emptyProc,
        PARAPET_IW: join(stateDir, 'no-iw-here'),
        PARAPET_OS_RELEASE: join(stateDir, 'no-os-release'),
        PARAPET_VERSION_FILE: join(stateDir, 'no-version-file'),
      });
      expect(result.code).toBe(0);
      const body = bodyOf(server.requests[0]);
      expect(body).toEqual({
        seq: 1,
        sentAt: expect.stringMatching(ISO_UTC),
        firmware: execFileSync('uname', ['-r'], { encoding: 'utf8' }).trim(), // no os-release: the kernel
        radios: [],
      });
    });

    it('falls back to MemFree on kernels without MemAvailable', async () => {
      const oldProc = join(stateDir, 'proc');
      mkdirSync(oldProc);
      copyFileSync(join(fixtures, 'proc/uptime'), join(oldProc, 'uptime'));
      copyFileSync(join(fixtures, 'proc/loadavg'), join(oldProc, 'loadavg'));
      const meminfo = readFileSync(join(fixtures, 'proc/meminfo'), 'utf8').replace(/^MemAvailable:.*\n/m, '');
      writeFileSync(join(oldProc, 'meminfo'), meminfo);
      expect((await run({ PARAPET_PROC: oldProc })).code).toBe(0);
      expect(bodyOf(server.requests[0]).memFreeKb).toBe(21340);
    });

    it('works once the provisioning page has filled in the URL and token lines', async () => {
      const provisioned = readFileSync(agentPath, 'utf8')
        .replace('PARAPET_URL="${PARAPET_URL:-__PARAPET_URL__}"', `PARAPET_URL="\${PARAPET_URL:-${baseUrl}}"`)
        .replace('PARAPET_TOKEN="${PARAPET_TOKEN:-__PARAPET_TOKEN__}"', 'PARAPET_TOKEN="${PARAPET_TOKEN:-pnt_provisioned0001}"');
      const script = join(stateDir, 'parapet-agent.sh');
      writeFileSync(script, provisioned);
      expect((await run({ PARAPET_URL: undefined, PARAPET_TOKEN: undefined }, script)).code).toBe(0);
      expect(server.requests[0].headers.authorization).toBe('Bearer pnt_provisioned0001');
    });

    it('refuses to run unprovisioned and says where to get a configured copy', async () => {
      const result = await run({ PARAPET_URL: undefined });
      expect(result.code).toBe(3);
      expect(result.stderr).toMatch(/PARAPET_URL is not set: download the agent again from the node's provisioning page/);
      expect(server.requests).toHaveLength(0);
    });

    it('reads settings from the config file, with the environment taking precedence', async () => {
      const conf = join(stateDir, 'agent.conf');
      writeFileSync(conf, `# written by the installer\nPARAPET_URL="${baseUrl}"\nPARAPET_TOKEN='pnt_fromfile0002'\nNOT_OURS=1\n`);
      expect((await run({ PARAPET_CONFIG: conf, PARAPET_URL: undefined, PARAPET_TOKEN: undefined })).code).toBe(0);
      expect(server.requests[0].headers.authorization).toBe('Bearer pnt_fromfile0002');
      expect((await run({ PARAPET_CONFIG: conf, PARAPET_URL: undefined })).code).toBe(0);
      expect(server.requests[1].headers.authorization).toBe(`Bearer ${TOKEN}`);
    });
  });
}
