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
if (!fs.existsSync(path.resolve('dist/index.html'))) {
  console.error('The client is not built: run `npm run build` first.');
  process.exit(2);
}
const EMAIL = process.env.BENCH_EMAIL ?? 'admin@parapet.example';
const PASSWORD = process.env.PARAPET_DEMO_PASSWORD ?? 'parapet-demo';
// "Slow 4G" as the issue measured it: 1.6 Mbps down, 750 kbps up, 150 ms round trip.
const SLOW = { offline: false, latency: 150, downloadThroughput: (1.6e6 / 8) | 0, uploadThroughput: (750e3 / 8) | 0 };
const PAGES: { path: string; signedIn: boolean }[] = [
  { path: '/status', signedIn: false },
  { path: '/sign-in', signedIn: false },
  ...['/', '/topology', '/outages', '/nodes', '/sites', '/neighbourhoods', '/reports', '/planning', '/people', '/account', '/my-nodes'].map((p) => ({ path: p, signedIn: true })),
];
const TIME_LIMIT_MS = 60_000;

interface Figures {
  requests: number;
  wireBytes: number;
  decodedBytes: number;
  jsWireBytes: number;
  usableMs: number;
}

/** A page is usable once its heading is drawn and nothing says "Loading…" any more. */
const usable = () => Boolean(document.querySelector('h1')) && ![...document.querySelectorAll('[role=status]')].some((el) => /^Loading|^Checking/.test(el.textContent ?? ''));

async function measure(context: BrowserContext, url: string, throttle: boolean): Promise<Figures> {
  const page: Page = await context.newPage();
  const cdp = await context.newCDPSession(page);
  await cdp.send('Network.enable');
  await cdp.send('Network.setCacheDisabled', { cacheDisabled: true });
  if (throttle) await cdp.send('Network.emulateNetworkConditions', SLOW);
  const types = new Map<string, string>();
  const decoded = new Map<string, number>();
  const figures: Figures = { requests: 0, wireBytes: 0, decodedBytes: 0, jsWireBytes: 0, usableMs: 0 };
  cdp.on('Network.responseReceived', (e) => types.set(e.requestId, e.type));
  cdp.on('Network.dataReceived', (e) => decoded.set(e.requestId, (decoded.get(e.requestId) ?? 0) + e.dataLength));
  cdp.on('Network.loadingFinished', (e) => {
    figures.requests++;
    figures.wireBytes += e.encodedDataLength;
    figures.decodedBytes += decoded.get(e.requestId) ?? 0;
    if (types.get(e.requestId) === 'Script') figures.jsWireBytes += e.encodedDataLength;
  });
  const started = performance.now();
  await page.goto(url, { waitUntil: 'commit', timeout: TIME_LIMIT_MS });
  await page.waitForFunction(usable, undefined, { timeout: TIME_LIMIT_MS, polling: 50 });
  figures.usableMs = performance.now() - started;
  // Let late requests (fonts, the live connection's first poll) finish, so the bytes are the page's whole first load.
  await page.waitForLoadState('networkidle', { timeout: TIME_LIMIT_MS }).catch(() => undefined);
  await page.close();
  return figures;
}

const kb = (bytes: number) => (bytes / 1024).toFixed(1).padStart(7);

const server = await startServerProcess({ DATABASE_URL: databaseUrl, CLIENT_DIST: 'dist', JOBS_ENABLED: 'false', SESSION_SECRET: 'bench-secret-bench-secret', SIGNIN_LIMIT_PER_ADDRESS: '100000', SIGNIN_LIMIT_PER_ACCOUNT: '100000' });
const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium', headless: true, args: ['--no-sandbox', '--disable-gpu', '--disable-quic'] });
try {
  const signedOut = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const signedIn = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const answer = await signedIn.request.post(`${server.url}/api/v1/session`, { data: { email: EMAIL, password: PASSWORD } });
  if (!answer.ok()) throw new Error(`Signing in as ${EMAIL} failed (${answer.status()}): load the demo, or set BENCH_EMAIL and PARAPET_DEMO_PASSWORD.`);

  console.log(`bench: ${server.url}, a phone-sized browser, cache off; "slow 4G" = 1.6 Mbps down, 150 ms round trip`);
  console.log('page             requests  wire KB  decoded KB  JS wire KB  usable (fast)  usable (slow 4G)');
  for (const { path: pagePath, signedIn: needsSession } of PAGES) {
    const context = needsSession ? signedIn : signedOut;
    const fast = await measure(context, `${server.url}${pagePath}`, false);
    const slow = await measure(context, `${server.url}${pagePath}`, true);
    console.log(
      `${pagePath.padEnd(16)} ${String(fast.requests).padStart(8)} ${kb(fast.wireBytes)}  ${kb(fast.decodedBytes).padStart(10)}  ${kb(fast.jsWireBytes).padStart(10)}  ${(fast.usableMs / 1000).toFixed(2).padStart(11)} s  ${(slow.usableMs / 1000).toFixed(2).padStart(14)} s`,
    );
  }
} finally {
  await browser.close();
  await server.stop();
}
