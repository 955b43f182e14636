import pg from 'pg';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ServerProcess } from '../../server/tools/serverProcess';
import { launchBrowser, screenshot, signInAs, startE2EServer } from './helpers/browser';

// Two nodes of this file's own in Old Quay whose radios talk without a link in the inventory; removed afterwards.
const TAG = `e2e-air-${Date.now()}`;
const MACS = ['02:e2:e0:00:00:0a', '02:e2:e0:00:00:0b'];

describe('links heard on the air, on the map', () => {
  let server: ServerProcess;
  let browser: Browser;
  let page: Page;
  const db = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  const nodeIds: number[] = [];
  const siteIds: number[] = [];
  const radioIds: number[] = [];

  beforeAll(async () => {
    [server, browser] = await Promise.all([startE2EServer(), launchBrowser()]);
    await db.connect();
    const hood = (await db.query<{ id: number }>(`SELECT id FROM neighbourhoods WHERE name = 'Old Quay'`)).rows[0].id;
    for (const [i, suffix] of ['a', 'b'].entries()) {
      const site = (
        await db.query<{ id: number }>(
          `INSERT INTO sites (neighbourhood_id, name, latitude, longitude) SELECT $1, $2, latitude - 0.004 - $3 * 0.003, longitude + 0.004
         FROM sites WHERE neighbourhood_id = $1 ORDER BY id LIMIT 1 RETURNING id`,
          [hood, `${TAG}-${suffix}`, i],
        )
      ).rows[0].id;
      siteIds.push(site);
      nodeIds.push(
        (
          await db.query<{ id: number }>(`INSERT INTO nodes (site_id, neighbourhood_id, name) VALUES ($1, $2, $3) RETURNING id`, [
            site,
            hood,
            `lf-${TAG}-${suffix}`,
          ])
        ).rows[0].id,
      );
      radioIds.push(
        (
          await db.query<{ id: number }>(
            `INSERT INTO radios (node_id, iface, band, channel, channel_width_mhz, tx_power_dbm, antenna_gain_dbi, role, encryption)
         VALUES ($1, 'wlan0', '5', 44, 20, 18, 23, 'backhaul-ap', 'wpa2-ccmp') RETURNING id`,
            [nodeIds[i]],
          )
        ).rows[0].id,
      );
    }
    page = await (await browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage();
    await signInAs(page, server.url, 'operator@parapet.example');
  });

  afterAll(async () => {
    if (nodeIds.length) {
      await db.query('DELETE FROM links WHERE radio_a_id = ANY($1) OR radio_b_id = ANY($1)', [radioIds]);
      await db.query('DELETE FROM heartbeats WHERE node_id = ANY($1)', [nodeIds]);
      await db.query('DELETE FROM outages WHERE node_id = ANY($1)', [nodeIds]);
      await db.query('DELETE FROM radio_mac_moves WHERE from_node_id = ANY($1) OR to_node_id = ANY($1)', [nodeIds]);
      await db.query('DELETE FROM nodes WHERE id = ANY($1)', [nodeIds]);
      await db.query('DELETE FROM sites WHERE id = ANY($1)', [siteIds]);
    }
    await db.end();
    await browser?.close();
    await server?.stop();
  });

  it('draws a pair the reports show talking as a dotted line, and one click adds it to the inventory', async () => {
    // Each node reports its radio's own MAC and names the other as its peer.
    for (const [i, nodeId] of nodeIds.entries()) {
      const token = await page.evaluate(async (id) => {
        const session = await (await fetch('/api/v1/session')).json();
        return (await (await fetch(`/api/v1/nodes/${id}/ingest-token`, { method: 'POST', headers: { 'X-CSRF-Token': session.csrfToken } })).json())
          .token as string;
      }, nodeId);
      const res = await fetch(`${server.url}/api/v1/heartbeats`, {
        method: 'POST',
        headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'application/json' },
        body: JSON.stringify({ seq: 1, sentAt: new Date().toISOString(), radios: [{ iface: 'wlan0', mac: MACS[i], peerMac: MACS[1 - i], signalDbm: -66 }] }),
      });
      expect(res.status).toBe(202);
    }

    await page.goto(`${server.url}/topology`);
    const line = page.getByTestId(`topology-discovered-${radioIds[0]}-${radioIds[1]}`);
    await line.waitFor({ state: 'attached', timeout: 30_000 });
    expect(await line.getAttribute('stroke-dasharray')).toBe('0.1 7');
    const finding = page.getByTestId(`discovered-${radioIds[0]}-${radioIds[1]}`);
    expect(await finding.innerText()).toMatch(new RegExp(`lf-${TAG}-a ↔ lf-${TAG}-b · -66 dBm`));
    await screenshot(page, 'air-links-1-discovered-1280');

    await finding.getByRole('button', { name: /Add to the inventory/ }).click();
    await finding.waitFor({ state: 'detached', timeout: 30_000 });
    await line.waitFor({ state: 'detached', timeout: 30_000 });
    const links = await db.query<{ status: string }>(
      'SELECT status FROM links WHERE least(radio_a_id, radio_b_id) = $1 AND greatest(radio_a_id, radio_b_id) = $2',
      [Math.min(...radioIds), Math.max(...radioIds)],
    );
    expect(links.rows).toEqual([{ status: 'live' }]);
    await screenshot(page, 'air-links-2-added-1280');
  }, 180_000);
});
