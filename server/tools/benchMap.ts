// `npm run bench:map`: the network map at the size of a big town, in a real browser against the built
// client. Adds the 2,100-node town (tests/helpers/bigTown.ts) to the database DATABASE_URL names, starts
// a server process on loopback, and prints: time to the neighbourhood view, to expand a quarter, from
// Find to the found node with its panel, and the frame gaps while 300 state changes a second arrive for
// 10 s; then one JSON line. Removes the town when done. A benchmark that prints figures, not a test.
import os from 'node:os';
import fs from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import { chromium, type Browser } from 'playwright-core';
import { countsIn, frameLine, readFrameStats, removeBigTown, seedBigTown, sendStateStorm, startFrameStats } from '../../tests/helpers/bigTown';
import { startServerProcess, type ServerProcess } from './serverProcess';

const databaseUrl = process.env.DATABASE_URL;
if (!databaseUrl) {
  console.error('DATABASE_URL is not set: point it at a migrated database with the demo loaded (start.sh prints it); the town is added and removed.');
  process.exit(2);
}
if (!fs.existsSync(path.resolve('dist/index.html'))) {
  console.error('The client is not built: run `npm run build` first.');
  process.exit(2);
}
const NODES = Number(process.env.BENCH_MAP_NODES ?? 2_100);
const EVENTS_PER_S = Number(process.env.BENCH_MAP_EVENTS_PER_S ?? 300);
const STORM_S = Number(process.env.BENCH_MAP_STORM_S ?? 10);
const EMAIL = process.env.BENCH_EMAIL ?? 'admin@parapet.example';
const PASSWORD = process.env.PARAPET_DEMO_PASSWORD ?? 'parapet-demo';
const WAIT_MS = 120_000;

const db = new pg.Client({ connectionString: databaseUrl });
await db.connect();
const load = () =>
  os
    .loadavg()
    .map((l) => l.toFixed(1))
    .join(' ');
console.log(`bench:map: ${NODES} nodes, ${EVENTS_PER_S} events/s for ${STORM_S} s; ${os.cpus().length} cores, load average ${load()}`);
let server: ServerProcess | null = null;
let browser: Browser | null = null;
let failed = false;
try {
  const seededAt = performance.now();
  const town = await seedBigTown(db, NODES);
  console.log(`seeded ${town.nodes.length} nodes and ${town.linkCount} links in ${Math.round(performance.now() - seededAt)} ms`);
  server = await startServerProcess({
    DATABASE_URL: databaseUrl,
    CLIENT_DIST: 'dist',
    // No scheduled jobs: the town's nodes change only by the events this benchmark sends.
    JOBS_ENABLED: 'false',
    SOCKET_ADAPTER: 'postgres',
    SESSION_SECRET: 'bench-secret-bench-secret',
    SIGNIN_LIMIT_PER_ADDRESS: '100000',
    SIGNIN_LIMIT_PER_ACCOUNT: '100000',
  });
  browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic'],
  });
  const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  // tsx keeps function names with an `__name` helper, which the functions sent to the page call: give the page one.
  await context.addInitScript({ content: 'globalThis.__name = (fn) => fn;' });
  const answer = await context.request.post(`${server.url}/api/v1/session`, { data: { email: EMAIL, password: PASSWORD } });
  if (!answer.ok()) throw new Error(`Signing in as ${EMAIL} failed (${answer.status()}): load the demo, or set BENCH_EMAIL and PARAPET_DEMO_PASSWORD.`);
  const page = await context.newPage();
  const timedWait = (selector: string) => page.locator(selector).first().waitFor({ timeout: WAIT_MS });

  // 1. Navigation to every quarter's mark drawn.
  let answeredAt = 0;
  page.on('response', (res) => {
    if (new URL(res.url()).pathname === '/api/v1/topology' && !answeredAt) answeredAt = performance.now();
  });
  const t0 = performance.now();
  await page.goto(`${server.url}/topology`);
  for (const hood of town.neighbourhoods) await timedWait(`[data-testid="topology-hood-${hood.id}"]`);
  const viewMs = performance.now() - t0;
  const topologyMs = answeredAt - t0;

  // 2. Enter on a quarter's mark until its first node is drawn.
  const [first, second] = town.neighbourhoods;
  const firstNode = town.nodes.find((n) => n.neighbourhoodId === first.id)!;
  const t1 = performance.now();
  await page.locator(`.react-flow__node[data-id="hood-${first.id}"]`).focus();
  await page.keyboard.press('Enter');
  await timedWait(`[data-testid="topology-node-${firstNode.id}"]`);
  const expandMs = performance.now() - t1;

  // 3. Find a node in another, folded quarter: drawn, and its panel open.
  const wanted = [...town.nodes].reverse().find((n) => n.neighbourhoodId === second.id)!;
  const t2 = performance.now();
  await page.getByLabel('Find a node').fill(wanted.name);
  await page.getByRole('button', { name: 'Find', exact: true }).click();
  await timedWait(`[data-testid="topology-node-${wanted.id}"]`);
  await timedWait('[data-testid="node-quick-look"]');
  const findMs = performance.now() - t2;

  // 4. Frames on the map as it opens (every mark in view): 3 s quiet (what the machine's load alone costs), then
  // the storm; the marks must end on the right counts.
  await page.goto(`${server.url}/topology`);
  for (const hood of town.neighbourhoods) await timedWait(`[data-testid="topology-hood-${hood.id}"]`);
  await timedWait('[data-testid="live-indicator"][data-status="live"]');
  await startFrameStats(page);
  await page.waitForTimeout(3_000);
  const quiet = await readFrameStats(page);
  const storm = await sendStateStorm(databaseUrl, town, EVENTS_PER_S, STORM_S);
  const settledAt = performance.now();
  for (const hood of town.neighbourhoods) {
    await page.waitForFunction(
      ([id, want]) => document.querySelector(`[data-testid="topology-hood-${id}"]`)?.getAttribute('data-counts') === want,
      [hood.id, countsIn(town, hood.id, storm.states)] as const,
      { timeout: WAIT_MS },
    );
  }
  const settleMs = performance.now() - settledAt;
  const frames = await readFrameStats(page, true);

  const ms = (x: number) => `${Math.round(x)} ms`;
  console.log(`neighbourhood view (navigation to every mark): ${ms(viewMs)} (GET /api/v1/topology answered at ${ms(topologyMs)})`);
  console.log(`expand a quarter of ${town.nodes.filter((n) => n.neighbourhoodId === first.id).length} nodes: ${ms(expandMs)}`);
  console.log(`Find to the node drawn with its panel: ${ms(findMs)}`);
  console.log(`frames, 3 s with no events: ${frameLine(quiet)}`);
  console.log(`frames, ${storm.sent} events in ${storm.seconds.toFixed(1)} s: ${frameLine(frames)}`);
  console.log(`marks agreed with the last event ${ms(settleMs)} after the storm; load average now ${load()}`);
  console.log(
    JSON.stringify({
      bench: 'map',
      nodes: town.nodes.length,
      loadAverage: os.loadavg()[0],
      viewMs: Math.round(viewMs),
      topologyMs: Math.round(topologyMs),
      expandMs: Math.round(expandMs),
      findMs: Math.round(findMs),
      eventsSent: storm.sent,
      eventsPerS: Math.round(storm.sent / storm.seconds),
      frameGapP50Ms: +frames.p50.toFixed(1),
      frameGapP99Ms: +frames.p99.toFixed(1),
      frameGapMaxMs: +frames.max.toFixed(1),
      longFrames: frames.longFrames,
      quietFrameGapMaxMs: +quiet.max.toFixed(1),
      settleMs: Math.round(settleMs),
    }),
  );
} catch (error) {
  failed = true;
  console.error(error instanceof Error ? error.message : error);
} finally {
  await browser?.close();
  await server?.stop();
  // Everything the town added goes, whatever happened above.
  await removeBigTown(db);
  await db.end();
}
process.exit(failed ? 1 : 0);
