import pg from 'pg';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ServerProcess } from '../../server/tools/serverProcess';
import { mailTo } from '../helpers/mailFake';
import { launchBrowser, screenshot, signInAs, startE2EServer } from './helpers/browser';

// A host, site and node of this file's own in Old Quay (the demo operator's neighbourhood), removed afterwards.
const TAG = `e2e-recovery-${Date.now()}`;
const HOST_EMAIL = `${TAG}@example.test`;
const NODE_NAME = `lf-${TAG}`;
// The smallest report interval the API allows: offline 30 s after the last report.
const REPORT_INTERVAL_S = 10;

const waitFor = async <T>(what: string, probe: () => Promise<T | null | undefined>, ms = 120_000): Promise<T> => {
  const end = Date.now() + ms;
  for (;;) {
    const value = await probe();
    if (value) return value;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 500));
  }
};

describe('a host guided back online from their phone', () => {
  let server: ServerProcess;
  let browser: Browser;
  let host: Page;
  let operator: Page;
  const db = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  let nodeId = 0;
  let siteId = 0;
  let userId = 0;
  let token = '';
  let seq = 0;

  const report = async () => {
    const res = await fetch(`${server.url}/api/v1/heartbeats`, {
      method: 'POST',
      headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' },
      body: JSON.stringify({ seq: ++seq, sentAt: new Date().toISOString(), uptimeS: 30, radios: [{ iface: 'wlan0', signalDbm: -62, noiseDbm: -95 }] }),
    });
    expect(res.status).toBe(202);
  };

  beforeAll(async () => {
    [server, browser] = await Promise.all([startE2EServer({ HEALTH_CHECK_INTERVAL_MS: '500', FIGURES_THROTTLE_MS: '0' }), launchBrowser()]);
    await db.connect();
    userId = (await db.query<{ id: number }>(`INSERT INTO users (email, name, role) VALUES ($1, 'Wren Albery', 'host') RETURNING id`, [HOST_EMAIL])).rows[0].id;
    const hood = (await db.query<{ id: number }>(`SELECT id FROM neighbourhoods WHERE name = 'Old Quay'`)).rows[0].id;
    siteId = (
      await db.query<{ id: number }>(
        `INSERT INTO sites (neighbourhood_id, name, latitude, longitude, host_user_id) SELECT $1, $2, latitude + 0.001, longitude, $3
       FROM sites WHERE neighbourhood_id = $1 LIMIT 1 RETURNING id`,
        [hood, `Ropewalk ${TAG}`, userId],
      )
    ).rows[0].id;
    nodeId = (
      await db.query<{ id: number }>(`INSERT INTO nodes (site_id, neighbourhood_id, name, report_interval_s) VALUES ($1, $2, $3, $4) RETURNING id`, [
        siteId,
        hood,
        NODE_NAME,
        REPORT_INTERVAL_S,
      ])
    ).rows[0].id;

    operator = await (await browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage();
    await signInAs(operator, server.url, 'operator@parapet.example');
    token = await operator.evaluate(async (id) => {
      const session = await (await fetch('/api/v1/session')).json();
      const res = await fetch(`/api/v1/nodes/${id}/ingest-token`, { method: 'POST', headers: { 'X-CSRF-Token': session.csrfToken } });
      return (await res.json()).token as string;
    }, nodeId);
    host = await (await browser.newContext({ viewport: { width: 375, height: 760 }, isMobile: true, hasTouch: true })).newPage();
  });

  afterAll(async () => {
    if (nodeId) {
      await db.query('DELETE FROM outbox WHERE node_id = $1 OR recipient_user_id = $2', [nodeId, userId]);
      await db.query('DELETE FROM heartbeats WHERE node_id = $1', [nodeId]);
      await db.query('DELETE FROM outages WHERE node_id = $1', [nodeId]);
      await db.query('DELETE FROM nodes WHERE id = $1', [nodeId]);
    }
    if (siteId) await db.query('DELETE FROM sites WHERE id = $1', [siteId]);
    if (userId) await db.query('DELETE FROM users WHERE id = $1', [userId]);
    await db.end();
    await browser?.close();
    await server?.stop();
  });

  it('the host opens the mail link, marks a step, the operator sees it live, and the page says the node is back when it reports', async () => {
    await report();
    // Silent past its grace: an outage opens and the host's mail goes out with the recovery link.
    const outageId = await waitFor(
      'the outage',
      async () => (await db.query<{ id: number }>('SELECT id FROM outages WHERE node_id = $1 AND ended_at IS NULL', [nodeId])).rows[0]?.id,
    );
    const mail = await waitFor('the host mail', async () => (await mailTo([HOST_EMAIL])).find((m) => m.subject.includes(NODE_NAME)));
    const link = /https?:\/\/\S+\/recover\?t=[A-Za-z0-9._-]+/.exec(mail.text)?.[0];
    expect(link, 'the mail carries the recovery link').toBeTruthy();

    await operator.goto(`${server.url}/outages/${outageId}`);
    const timeline = operator.getByTestId('outage-timeline');
    await timeline.getByText('stopped answering').waitFor({ timeout: 30_000 });

    // No password on the phone: the link is the permission. The safety note comes before any step.
    await host.goto(link!);
    await host.getByRole('heading', { name: 'Before you start' }).waitFor({ timeout: 30_000 });
    expect(await host.getByRole('note', { name: 'Safety' }).innerText()).toMatch(/Do not climb onto the roof.*PoE injector/s);
    expect(await host.getByTestId('recovery-waiting').innerText()).toMatch(/has not answered since/);
    await screenshot(host, 'host-recovery-1-safety-375');
    await host.getByRole('button', { name: 'I understand, show the first step' }).click();
    await host.getByRole('heading', { name: 'Check the power' }).waitFor();
    await screenshot(host, 'host-recovery-2-first-step-375');
    await host.getByRole('button', { name: 'Done, it is still not back' }).click();
    await host.getByRole('heading', { name: 'Replug the PoE injector' }).waitFor();
    expect(await host.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375);

    // The operator's page shows the step without a reload.
    await timeline.getByText('Wren Albery (host) checked the power').waitFor({ timeout: 30_000 });
    await screenshot(operator, 'host-recovery-3-operator-timeline-1280');

    // A report arrives: the phone says so at once, with no refresh.
    await report();
    const back = host.getByTestId('recovery-back');
    await back.waitFor({ timeout: 30_000 });
    expect(await back.innerText()).toMatch(/We heard from your node \d+ s ago: it is back/);
    await screenshot(host, 'host-recovery-4-back-375');
  }, 300_000); // a node must fall silent past its report interval first, on a loaded machine
});
