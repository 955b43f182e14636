import pg from 'pg';
import { request as playwrightRequest, type APIRequestContext, type Browser, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ServerProcess } from '../helpers/serverProcess';
import { DEMO_PASSWORD, launchBrowser, screenshot, signInAs, startE2EServer } from './helpers/browser';

// The Saltmarsh Row relay and the leaves behind it; no other end-to-end file touches them.
const RELAY = 'lf-marsh';
const LEAVES = ['lf-reed', 'lf-heron', 'lf-tide', 'lf-samphire', 'lf-dyke', 'lf-brine'];
const ADMIN = 'admin@parapet.example';
// The smallest report interval the API allows: silent 30 s after the last report.
const REPORT_INTERVAL_S = 10;
const SILENT_WAIT_MS = 60_000;

interface Saved {
  id: number;
  name: string;
  state: string;
  state_since: Date | null;
  last_seen_at: Date | null;
  last_report: unknown;
  report_interval_s: number;
}

async function signedInApi(request: APIRequestContext, baseUrl: string) {
  const signIn = await request.post(`${baseUrl}/api/v1/session`, { data: { email: ADMIN, password: DEMO_PASSWORD } });
  expect(signIn.status()).toBe(200);
  const csrfToken = ((await (await request.get(`${baseUrl}/api/v1/session`)).json()) as { csrfToken: string }).csrfToken;
  const headers = { 'X-CSRF-Token': csrfToken };
  return {
    setReportInterval: async (id: number, reportIntervalS: number) =>
      expect((await request.patch(`${baseUrl}/api/v1/nodes/${id}`, { headers, data: { reportIntervalS } })).status()).toBe(200),
    token: async (id: number) => ((await (await request.post(`${baseUrl}/api/v1/nodes/${id}/ingest-token`, { headers })).json()) as { token: string }).token,
  };
}

let lastSeq = 0;
async function report(baseUrl: string, token: string, clients: number) {
  lastSeq = Math.max(lastSeq + 1, Date.now());
  const res = await fetch(`${baseUrl}/api/v1/heartbeats`, {
    method: 'POST',
    headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' },
    body: JSON.stringify({
      seq: lastSeq,
      sentAt: new Date().toISOString(),
      uptimeS: 3600,
      radios: [
        { iface: 'wlan0', signalDbm: -60, noiseDbm: -95 },
        { iface: 'wlan1', role: 'access-point', clients },
      ],
    }),
  });
  expect(res.status).toBe(202);
}

describe('blast radius on the topology', () => {
  let server: ServerProcess;
  let browser: Browser;
  let page: Page;
  const db = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  let saved: Saved[] = [];
  let maxOutageId = 0;
  let maxStrandedId = 0;

  beforeAll(async () => {
    [server, browser] = await Promise.all([startE2EServer({ HEALTH_CHECK_INTERVAL_MS: '300' }), launchBrowser()]);
    await db.connect();
    saved = (
      await db.query<Saved>('SELECT id, name, state, state_since, last_seen_at, last_report, report_interval_s FROM nodes WHERE name = ANY($1) ORDER BY id', [
        [RELAY, ...LEAVES],
      ])
    ).rows;
    expect(saved).toHaveLength(1 + LEAVES.length);
    maxOutageId = (await db.query<{ m: number }>('SELECT coalesce(max(id), 0) AS m FROM outages')).rows[0].m;
    maxStrandedId = (await db.query<{ m: number }>('SELECT coalesce(max(id), 0) AS m FROM stranded_nodes')).rows[0].m;
  });
  afterAll(async () => {
    // Put the demo nodes back as they were: interval, state, figures; drop the outage this file opened.
    if (saved.length) {
      await db.query('DELETE FROM stranded_nodes WHERE id > $1', [maxStrandedId]);
      await db.query('DELETE FROM outbox WHERE outage_id IN (SELECT id FROM outages WHERE id > $1 AND node_id = ANY($2))', [
        maxOutageId,
        saved.map((s) => s.id),
      ]);
      await db.query('DELETE FROM outages WHERE id > $1 AND node_id = ANY($2)', [maxOutageId, saved.map((s) => s.id)]);
      for (const s of saved) {
        await db.query('UPDATE nodes SET state = $2, state_since = $3, last_seen_at = $4, last_report = $5, report_interval_s = $6 WHERE id = $1', [
          s.id,
          s.state,
          s.state_since,
          s.last_seen_at,
          s.last_report === null ? null : JSON.stringify(s.last_report),
          s.report_interval_s,
        ]);
      }
    }
    await db.end();
    await browser?.close();
    await server?.stop();
  });

  it('highlights the silent relay as the root and shows the leaves behind it as stranded', async () => {
    const setup = await playwrightRequest.newContext();
    const byName = new Map(saved.map((s) => [s.name, s.id]));
    try {
      const api = await signedInApi(setup, server.url);
      for (const s of saved) await api.setReportInterval(s.id, REPORT_INTERVAL_S);
      // Everyone reports once, together, then the relay and its leaves fall silent at once.
      for (const [i, s] of saved.entries()) await report(server.url, await api.token(s.id), i + 1);
    } finally {
      await setup.dispose();
    }
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    page = await context.newPage();
    await signInAs(page, server.url, ADMIN);
    const relayId = byName.get(RELAY)!;
    await page.goto(`${server.url}/topology?node=${relayId}`);
    await page.getByTestId('topology').waitFor();
    await page.locator(`[data-testid="topology-node-${relayId}"][data-state="offline"]`).waitFor({ timeout: SILENT_WAIT_MS });
    // Stranded leaves and the root's count arrive with the outage; a reload shows the outage's blast radius.
    await page.reload();
    await page.getByTestId('topology').waitFor();
    for (const leaf of LEAVES) await page.locator(`[data-testid="topology-node-${byName.get(leaf)}"][data-state="stranded"]`).waitFor({ timeout: 10_000 });
    const root = page.getByTestId(`topology-node-${relayId}`);
    expect(await root.getAttribute('data-cut-off')).toBe(String(LEAVES.length));
    expect(await root.getAttribute('title')).toContain(`${LEAVES.length} nodes cut off behind it`);
    await root.getByText(`${LEAVES.length} cut off behind it`).waitFor();
    await screenshot(page, 'blast-radius-topology');

    await page.goto(`${server.url}/outages?status=open`);
    await page.getByText(`${LEAVES.length} nodes cut off behind it`).first().waitFor({ timeout: 10_000 });
    await screenshot(page, 'blast-radius-outages');

    // The overview lists the open outage with what sits behind it.
    await page.goto(`${server.url}/`);
    await page.getByTestId('overview-open-outages').getByText(`${LEAVES.length} nodes cut off behind it`).waitFor({ timeout: 10_000 });
    await screenshot(page, 'blast-radius-overview');
    await context.close();
  }, 150_000);
});
