import pg from 'pg';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ServerProcess } from '../../server/tools/serverProcess';
import { launchBrowser, screenshot, signInAs, startE2EServer } from './helpers/browser';

// datetime-local wants the browser's local wall time, "YYYY-MM-DDTHH:MM".
const localInput = (d: Date) => new Date(d.getTime() - d.getTimezoneOffset() * 60_000).toISOString().slice(0, 16);

describe('the host portal on a phone', () => {
  let server: ServerProcess;
  let browser: Browser;
  let page: Page;
  const reason = `E2E power-off ${Date.now()}`;

  beforeAll(async () => {
    [server, browser] = await Promise.all([startE2EServer(), launchBrowser()]);
    page = await (await browser.newContext({ viewport: { width: 375, height: 760 }, isMobile: true, hasTouch: true })).newPage();
    await signInAs(page, server.url, 'host@parapet.example');
  });

  afterAll(async () => {
    // Leave the demo as it was: the window this test announced (already cancelled) goes.
    const db = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
    await db.connect();
    try {
      await db.query('DELETE FROM maintenance_windows WHERE reason = $1', [reason]);
    } finally {
      await db.end();
    }
    await browser?.close();
    await server?.stop();
  });

  it('lands on My nodes with a plain sentence, state as colour, shape and word, and no sideways scrolling', async () => {
    await page.waitForURL(/\/my-nodes$/);
    const quay = page.getByRole('region', { name: 'Quay Chandlery' });
    await quay.waitFor();
    const summary = await quay.getByTestId('health-summary').first().innerText();
    expect(summary).toMatch(/^Your node on Quay Chandlery /);
    const badge = quay.locator('[data-testid^="state-badge-"]').first();
    expect(await badge.innerText()).toMatch(/Online|Degraded|Offline|Maintenance|Stranded|Unknown/);
    expect(await badge.locator('svg[role="img"]').getAttribute('aria-label')).toMatch(
      /\((filled circle|triangle|square|hatched circle|hollow diamond|hollow circle)\)$/,
    );
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375);
    await screenshot(page, 'host-portal-1-my-nodes-375');
  });

  it('announces a planned power-off, then cancels it', async () => {
    const quay = page.getByRole('region', { name: 'Quay Chandlery' });
    const windows = quay.getByTestId('maintenance-windows').first();
    const start = new Date(Date.now() + 2 * 3600_000);
    const end = new Date(Date.now() + 5 * 3600_000);
    await windows.getByLabel('Starts').fill(localInput(start));
    await windows.getByLabel('Ends').fill(localInput(end));
    await windows.getByLabel('Reason (optional)').fill(reason);
    await windows.getByRole('button', { name: 'Announce maintenance' }).click();
    const row = windows.getByRole('listitem').filter({ hasText: reason });
    await row.waitFor();
    expect(await row.innerText()).toContain('Planned');
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375);
    await row.scrollIntoViewIfNeeded();
    await screenshot(page, 'host-portal-2-power-off-announced-375');

    await row.getByRole('button', { name: 'Cancel window' }).click();
    await row.waitFor({ state: 'detached' });
    const db = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
    await db.connect();
    try {
      const { rows } = await db.query('SELECT cancelled_at FROM maintenance_windows WHERE reason = $1', [reason]);
      expect(rows).toHaveLength(1);
      expect(rows[0].cancelled_at).not.toBeNull();
    } finally {
      await db.end();
    }
    await screenshot(page, 'host-portal-3-power-off-cancelled-375');
  });

  it('links to quiet hours and to contact details', async () => {
    await page.getByRole('link', { name: 'Quiet hours and mail' }).click();
    await page.waitForURL(/\/preferences$/);
    await page.goBack();
    await page.getByRole('link', { name: 'Your contact details' }).click();
    await page.waitForURL(/\/account$/);
    await page.getByTestId('contact-form').waitFor();
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375);
    await screenshot(page, 'host-portal-4-account-375');
  });
});
