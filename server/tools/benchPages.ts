// `npm run bench:pages`: bytes per page (compressed on the wire and decoded), and the first load on a
// slow mobile profile, in a real browser against the built client. A benchmark that prints figures.
import fs from 'node:fs';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { startServerProcess } from './serverProcess';

const databaseUrl = process.env.DATABASE_URL;
if (!databaseUrl) {
  console.error('DATABASE_URL is not set: point it at a database with the demo loaded (start.sh prints it).');
  process.exit(2);
}
// CLIENT_DIST measures another build (e.g. a copy of the one before a change) against the same server code.
const clientDist = process.env.CLIENT_DIST ?? 'dist';
if (!fs.existsSync(path.resolve(clientDist, 'index.html'))) {
  console.error('The client is not built: run `npm run build` first.');
  process.exit(2);
}
const EMAIL = process.env.BENCH_EMAIL ?? 'admin@parapet.example';
const PASSWORD = process.env.PARAPET_DEMO_PASSWORD ?? 'parapet-demo';
// "Slow 4G" as the issue measured it: 1.6 Mbps down, 750 kbps up, 150 ms round trip.
const SLOW = { offline: false, latency: 150, downloadThroughput: (1.6e6 / 8) | 0, uploadThroughput: (750e3 / 8) | 0 };
// Each page with the element that shows its first data (a table row, a card, the filled form): the page is
// usable once its heading and that element are drawn and nothing says "Loading…" any more.
const PAGES: { path: string; signedIn: boolean; data: string }[] = [
  { path: '/status', signedIn: false, data: '[data-testid=public-neighbourhood]' },
  { path: '/sign-in', signedIn: false, data: 'form input[type=password]' },
  { path: '/', signedIn: true, data: '[data-testid=overview-counts] li' },
  { path: '/topology', signedIn: true, data: '[data-testid^=topology-node-]' },
  { path: '/outages', signedIn: true, data: '[data-testid=outages-table] tbody tr' },
  { path: '/nodes', signedIn: true, data: '[data-testid=nodes-table] tbody tr' },
  { path: '/sites', signedIn: true, data: '[data-testid=sites-table] tbody tr' },
  { path: '/neighbourhoods', signedIn: true, data: '[data-testid=neighbourhoods-table] tbody tr' },
  { path: '/reports', signedIn: true, data: '[data-testid=report-overall]' },
  { path: '/planning', signedIn: true, data: '[data-testid=planning-index] li' },
  { path: '/people', signedIn: true, data: '[data-testid=people-table] tbody tr' },
  { path: '/account', signedIn: true, data: '[data-testid=contact-form] input' },
  { path: '/my-nodes', signedIn: true, data: '[data-testid^=hosted-node-]' },
];
const TIME_LIMIT_MS = 60_000;
// The budget for compressed JS on the two pages a visitor reaches before signing in.
const JS_BUDGET_KB: Record<string, number> = { '/status': 120, '/sign-in': 120 };
// `npm run bench:pages -- --waterfall /nodes /sites`: only those pages, and each slow-4G request's start and end.
const args = process.argv.slice(2);
const WATERFALL = args.includes('--waterfall');
const ONLY = args.filter((a) => a.startsWith('/'));

const kb = (bytes: number) => (bytes / 1024).toFixed(1).padStart(7);

interface Figures {
  requests: number;
  wireBytes: number;
  decodedBytes: number;
  jsWireBytes: number;
  usableMs: number;
  waterfall: string[];
}

/** Runs in the page: its heading and its first data are drawn, and nothing says "Loading…" or "Checking…". */
const usable = (data: string) =>
  Boolean(document.querySelector('h1')?.textContent?.trim()) &&
  Boolean(document.querySelector(data)) &&
  ![...document.querySelectorAll('[role=status]')].some((el) => /^Loading|^Checking/.test(el.textContent?.trim() ?? ''));

async function measure(context: BrowserContext, url: string, data: string, throttle: boolean): Promise<Figures> {
  const page: Page = await context.newPage();
  const cdp = await context.newCDPSession(page);
  await cdp.send('Network.enable');
  await cdp.send('Network.setCacheDisabled', { cacheDisabled: true });
  if (throttle) await cdp.send('Network.emulateNetworkConditions', SLOW);
  const types = new Map<string, string>();
  const decoded = new Map<string, number>();
  const figures: Figures = { requests: 0, wireBytes: 0, decodedBytes: 0, jsWireBytes: 0, usableMs: 0, waterfall: [] };
  const sent = new Map<string, { at: number; url: string }>();
  let origin = 0;
  cdp.on('Network.requestWillBeSent', (e) => {
    if (!origin) origin = e.timestamp;
    sent.set(e.requestId, { at: e.timestamp, url: e.request.url.replace(/^https?:\/\/[^/]+/, '') });
  });
  cdp.on('Network.responseReceived', (e) => types.set(e.requestId, e.type));
  cdp.on('Network.dataReceived', (e) => decoded.set(e.requestId, (decoded.get(e.requestId) ?? 0) + e.dataLength));
  cdp.on('Network.loadingFinished', (e) => {
    figures.requests++;
    figures.wireBytes += e.encodedDataLength;
    figures.decodedBytes += decoded.get(e.requestId) ?? 0;
    if (types.get(e.requestId) === 'Script') figures.jsWireBytes += e.encodedDataLength;
    const request = sent.get(e.requestId);
    if (request) {
      const ms = (t: number) => String(Math.round((t - origin) * 1000)).padStart(6);
      figures.waterfall.push(`${ms(request.at)} ms → ${ms(e.timestamp)} ms  ${kb(e.encodedDataLength)} KB  ${request.url.slice(0, 90)}`);
    }
  });
  const started = performance.now();
  await page.goto(url, { waitUntil: 'commit', timeout: TIME_LIMIT_MS });
  await page.waitForFunction(usable, data, { timeout: TIME_LIMIT_MS, polling: 50 });
  figures.usableMs = performance.now() - started;
  // Let late requests (fonts, the live connection's first poll) finish, so the bytes are the page's whole first load.
  await page.waitForLoadState('networkidle', { timeout: TIME_LIMIT_MS }).catch(() => undefined);
  await page.close();
  return figures;
}

function budgetNote(pagePath: string, jsWireBytes: number): string {
  const budget = JS_BUDGET_KB[pagePath];
  if (budget === undefined) return '';
  return `${jsWireBytes / 1024 <= budget ? 'within' : 'OVER'} ${budget} KB`;
}

const server = await startServerProcess({
  DATABASE_URL: databaseUrl,
  CLIENT_DIST: clientDist,
  JOBS_ENABLED: 'false',
  SESSION_SECRET: 'bench-secret-bench-secret',
  SIGNIN_LIMIT_PER_ADDRESS: '100000',
  SIGNIN_LIMIT_PER_ACCOUNT: '100000',
});
// The server is stopped whatever happens next (a browser that will not start included).
const browser = await chromium
  .launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', headless: true, args: ['--no-sandbox', '--disable-gpu', '--disable-quic'] })
  .catch(async (err: Error) => {
    await server.stop();
    throw err;
  });
try {
  const signedOut = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const signedIn = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const answer = await signedIn.request.post(`${server.url}/api/v1/session`, { data: { email: EMAIL, password: PASSWORD } });
  if (!answer.ok()) throw new Error(`Signing in as ${EMAIL} failed (${answer.status()}): load the demo, or set BENCH_EMAIL and PARAPET_DEMO_PASSWORD.`);

  console.log(`bench: ${server.url}, a phone-sized browser, cache off; "slow 4G" = 1.6 Mbps down, 150 ms round trip`);
  console.log('page             requests  wire KB  decoded KB  JS wire KB  usable (fast)  usable (slow 4G)  JS budget');
  for (const { path: pagePath, signedIn: needsSession, data } of PAGES.filter((p) => ONLY.length === 0 || ONLY.includes(p.path))) {
    const context = needsSession ? signedIn : signedOut;
    const fast = await measure(context, `${server.url}${pagePath}`, data, false);
    const slow = await measure(context, `${server.url}${pagePath}`, data, true);
    console.log(
      `${pagePath.padEnd(16)} ${String(fast.requests).padStart(8)} ${kb(fast.wireBytes)}  ${kb(fast.decodedBytes).padStart(10)}  ${kb(fast.jsWireBytes).padStart(10)}  ${(fast.usableMs / 1000).toFixed(2).padStart(11)} s  ${(slow.usableMs / 1000).toFixed(2).padStart(14)} s  ${budgetNote(pagePath, fast.jsWireBytes)}`,
    );
    // Sorted by when each request started (the times are padded, so text order is time order).
    if (WATERFALL) for (const line of slow.waterfall.sort()) console.log(`    ${line}`);
  }
} finally {
  await browser.close();
  await server.stop();
}
