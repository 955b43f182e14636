import { request as playwrightRequest, type APIRequestContext } from 'playwright-core';
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, screenshot, signInAs, useE2E } from './helpers/browser';

// Demo nodes no other end-to-end file touches: one goes up and down on the map, one stays down for the outages e2e.page.
const MAP_NODE = 'lf-weir';
const OUTAGE_NODE = 'lf-granarylane';
const ADMIN = 'admin@parapet.example';
// The smallest report interval the API allows; a node is offline after 3 missed intervals (30 s).
const REPORT_INTERVAL_S = 10;
const OFFLINE_WAIT_MS = 50_000;

interface NodeBody {
  id: number;
  name: string;
  state: string;
}

/** Signed-in API calls with the session's CSRF token, through a page's or a standalone request context. */
async function apiAs(request: APIRequestContext, baseUrl: string) {
  const session = await request.get(`${baseUrl}/api/v1/session`);
  expect(session.status()).toBe(200);
  const csrfToken = ((await session.json()) as { csrfToken: string }).csrfToken;
  const headers = { 'X-CSRF-Token': csrfToken };
  return {
    async nodeNamed(name: string): Promise<NodeBody> {
      const res = await request.get(`${baseUrl}/api/v1/nodes?q=${encodeURIComponent(name)}`);
      expect(res.status()).toBe(200);
      const node = ((await res.json()) as { data: NodeBody[] }).data.find((n) => n.name === name);
      if (!node) throw new Error(`the demo node ${name} is missing from the end-to-end database`);
      return node;
    },
    async setReportInterval(nodeId: number, reportIntervalS: number) {
      const res = await request.patch(`${baseUrl}/api/v1/nodes/${nodeId}`, { headers, data: { reportIntervalS } });
      expect(res.status()).toBe(200);
    },
    async issueToken(nodeId: number): Promise<string> {
      const res = await request.post(`${baseUrl}/api/v1/nodes/${nodeId}/ingest-token`, { headers });
      expect(res.status()).toBe(201);
      return ((await res.json()) as { token: string }).token;
    },
    async openOutageOf(nodeId: number): Promise<{ id: number; acknowledgedAt: string | null; notes: string | null } | undefined> {
      const res = await request.get(`${baseUrl}/api/v1/outages?nodeId=${nodeId}&status=open`);
      expect(res.status()).toBe(200);
      return ((await res.json()) as { data: { id: number; acknowledgedAt: string | null; notes: string | null }[] }).data[0];
    },
  };
}

// Sequence numbers from the millisecond clock keep rising across runs on the shared database.
let lastSeq = 0;
async function postHeartbeat(baseUrl: string, token: string) {
  lastSeq = Math.max(lastSeq + 1, Date.now());
  const res = await fetch(`${baseUrl}/api/v1/heartbeats`, {
    method: 'POST',
    headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' },
    body: JSON.stringify({
      reports: [
        {
          seq: lastSeq,
          sentAt: new Date().toISOString(),
          uptimeS: 3600,
          throughputMbps: 42,
          latencyMs: 9,
          radios: [{ iface: 'wlan0', signalDbm: -58, noiseDbm: -95 }],
        },
      ],
    }),
  });
  expect(res.status).toBe(202);
}

describe('the live network map and outages', () => {
  // The silence check runs every 300 ms so a node that stops reporting goes offline within a second of its grace.
  const e2e = useE2E({ HEALTH_CHECK_INTERVAL_MS: '300' });
  let outageNodeId: number;

  beforeAll(async () => {
    // The outage node reports once now and then falls silent, so its outage is open by the time the second test runs.
    const setup = await playwrightRequest.newContext();
    try {
      const signIn = await setup.post(`${e2e.server.url}/api/v1/session`, { data: { email: ADMIN, password: DEMO_PASSWORD } });
      expect(signIn.status()).toBe(200);
      const api = await apiAs(setup, e2e.server.url);
      outageNodeId = (await api.nodeNamed(OUTAGE_NODE)).id;
      await api.setReportInterval(outageNodeId, REPORT_INTERVAL_S);
      await postHeartbeat(e2e.server.url, await api.issueToken(outageNodeId));
    } finally {
      await setup.dispose();
    }
  });
  const nodeOnMap = (nodeId: number, state: string) => e2e.page.locator(`[data-testid="topology-node-${nodeId}"][data-state="${state}"]`);

  it('shows a node go online, offline and online again on the map without reloading', async () => {
    await e2e.fresh();
    await signInAs(e2e.page, e2e.server.url, ADMIN);
    const api = await apiAs(e2e.page.request, e2e.server.url);
    const node = await api.nodeNamed(MAP_NODE);
    await api.setReportInterval(node.id, REPORT_INTERVAL_S);
    const token = await api.issueToken(node.id);

    await e2e.page.goto(`${e2e.server.url}/topology?node=${node.id}`);
    await e2e.page.getByTestId('topology').waitFor();
    await e2e.page.getByTestId(`topology-node-${node.id}`).waitFor();
    await e2e.page.locator('[data-testid="live-indicator"][data-status="live"]').waitFor({ timeout: 10_000 });
    // A full reload would wipe this mark; it must survive every step below.
    await e2e.page.evaluate(() => Object.assign(window, { parapetNoReload: true }));
    await screenshot(e2e.page, 'topology-before-report');

    await postHeartbeat(e2e.server.url, token);
    await nodeOnMap(node.id, 'online').waitFor({ timeout: 10_000 });
    await e2e.page.getByTestId('node-quick-look').getByTestId('latest-figures').getByText('42 Mbps').waitFor({ timeout: 10_000 });
    await screenshot(e2e.page, 'topology-online');

    // No more reports: three missed 10 s intervals later the silence check marks it offline.
    await nodeOnMap(node.id, 'offline').waitFor({ timeout: OFFLINE_WAIT_MS });
    expect(await e2e.page.getByTestId(`topology-node-${node.id}`).getAttribute('title')).toMatch(/Offline/);
    await screenshot(e2e.page, 'topology-offline');

    await postHeartbeat(e2e.server.url, token);
    await nodeOnMap(node.id, 'online').waitFor({ timeout: 10_000 });
    await screenshot(e2e.page, 'topology-back-online');
    expect(await e2e.page.evaluate(() => (window as { parapetNoReload?: boolean }).parapetNoReload)).toBe(true);
  }, 120_000);

  it('acknowledges an open outage and adds notes from the outages page', async () => {
    await e2e.fresh();
    await signInAs(e2e.page, e2e.server.url, ADMIN);
    await e2e.page.goto(`${e2e.server.url}/outages?status=open`);
    await e2e.page.getByRole('heading', { name: 'Outages' }).waitFor();
    const api = await apiAs(e2e.page.request, e2e.server.url);

    // The outage node fell silent when the file started; its outage opens about 30 s after that report.
    const deadline = Date.now() + OFFLINE_WAIT_MS;
    let outage = await api.openOutageOf(outageNodeId);
    while (!outage && Date.now() < deadline) {
      await e2e.page.waitForTimeout(500);
      outage = await api.openOutageOf(outageNodeId);
    }
    if (!outage) throw new Error(`${OUTAGE_NODE} did not go offline within ${OFFLINE_WAIT_MS / 1000} s`);
    expect(outage.acknowledgedAt).toBeNull();

    // The page was open before the outage began: the row arrives through the live connection.
    const acknowledge = e2e.page.getByTestId(`acknowledge-${outage.id}`);
    await acknowledge.waitFor({ timeout: 10_000 });
    await screenshot(e2e.page, 'outages-open');
    await acknowledge.click();
    const table = e2e.page.getByTestId('outages-table');
    await acknowledge.waitFor({ state: 'detached' });
    await table.getByText('Marta Quillon').first().waitFor();

    await table.getByRole('button', { name: `Add notes for the outage of ${OUTAGE_NODE}` }).click();
    await e2e.page.getByLabel(`Notes on the outage of ${OUTAGE_NODE}`).fill('Host away; power cut on Granary Lane, back tonight.');
    await e2e.page.getByRole('button', { name: 'Save notes' }).click();
    await e2e.page.getByTestId(`notes-form-${outage.id}`).waitFor({ state: 'detached' });
    await table.getByText('Host away; power cut on Granary Lane, back tonight.').waitFor();
    await screenshot(e2e.page, 'outages-acknowledged');

    const after = await api.openOutageOf(outageNodeId);
    expect(after?.id).toBe(outage.id);
    expect(after?.acknowledgedAt).not.toBeNull();
    expect(after?.notes).toBe('Host away; power cut on Granary Lane, back tonight.');
  }, 90_000);

  it('fits the map, a node page and the outages page on a phone-sized screen', async () => {
    await e2e.fresh({ width: 375, height: 760 });
    await signInAs(e2e.page, e2e.server.url, ADMIN);
    const overflow = () => e2e.page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);

    await e2e.page.goto(`${e2e.server.url}/topology?node=${outageNodeId}`);
    await e2e.page.getByTestId('topology-legend').waitFor();
    // The graph must really be drawn: a canvas with height, and the chosen node inside it.
    const canvas = await e2e.page.getByTestId('topology').locator('.react-flow').boundingBox();
    expect(canvas?.height ?? 0).toBeGreaterThan(300);
    const nodeBox = await e2e.page.getByTestId(`topology-node-${outageNodeId}`).boundingBox();
    expect(nodeBox).not.toBeNull();
    expect(nodeBox!.y).toBeGreaterThanOrEqual(canvas!.y);
    expect(nodeBox!.y + nodeBox!.height).toBeLessThanOrEqual(canvas!.y + canvas!.height);
    await e2e.page.getByTestId('node-quick-look').getByText('Offline').first().waitFor();
    expect(await overflow()).toBeLessThanOrEqual(0);
    await screenshot(e2e.page, 'topology-phone');

    // Searching by a site's name finds its node, selects it and brings it into view.
    await e2e.page.getByLabel('Find a node').fill('Tidegate');
    await e2e.page.getByRole('button', { name: 'Find', exact: true }).click();
    await e2e.page.getByTestId('node-quick-look').getByRole('heading', { name: 'lf-tide' }).waitFor();
    expect(e2e.page.url()).toMatch(/[?&]node=\d+/);
    const tideId = Number(new URL(e2e.page.url()).searchParams.get('node'));
    await e2e.page.waitForTimeout(700); // the view glides to the node
    const tideBox = await e2e.page.getByTestId(`topology-node-${tideId}`).boundingBox();
    expect(tideBox).not.toBeNull();
    expect(tideBox!.y).toBeGreaterThanOrEqual(canvas!.y);
    expect(tideBox!.y + tideBox!.height).toBeLessThanOrEqual(canvas!.y + canvas!.height);
    await screenshot(e2e.page, 'topology-search-phone');

    await e2e.page.goto(`${e2e.server.url}/nodes/${outageNodeId}`);
    await e2e.page.getByTestId('latest-figures').waitFor();
    await e2e.page.getByTestId('node-availability').waitFor();
    expect(await overflow()).toBeLessThanOrEqual(0);
    await screenshot(e2e.page, 'node-detail-phone');

    await e2e.page.goto(`${e2e.server.url}/outages`);
    await e2e.page.getByTestId('outages-table').waitFor();
    expect(await overflow()).toBeLessThanOrEqual(0);
    await screenshot(e2e.page, 'outages-phone');
  }, 60_000);
});
