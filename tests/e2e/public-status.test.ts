import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PEOPLE, SITES } from '../../server/db/demoScenario';
import type { ServerProcess } from '../../server/tools/serverProcess';
import { launchBrowser, screenshot, startE2EServer } from './helpers/browser';

describe('the public status page', () => {
  let server: ServerProcess;
  let browser: Browser;

  beforeAll(async () => {
    [server, browser] = await Promise.all([startE2EServer(), launchBrowser()]);
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  it('shows a signed-out neighbour on a phone each neighbourhood in plain words, with no names or contacts', async () => {
    const context = await browser.newContext({ viewport: { width: 375, height: 812 }, isMobile: true, hasTouch: true });
    const page = await context.newPage();
    await page.goto(`${server.url}/status`);
    await page.getByTestId('public-neighbourhood').first().waitFor({ timeout: 15_000 });
    expect(page.url()).toBe(`${server.url}/status`); // not sent to sign-in
    const cards = page.getByTestId('public-neighbourhood');
    expect(await cards.count()).toBe(4);
    const text = await page.locator('main').innerText();
    for (const name of ['Old Quay', 'Millbrook', 'Saltmarsh Row', 'Chapel Hill']) expect(text).toContain(name);
    expect(text).toMatch(/\d+ of \d+ (nodes up|node up|down)/);
    expect(text).toMatch(/Up in the last 24 hours/);
    expect(text).toMatch(/Up in the last 30 days/);
    for (const p of PEOPLE) expect(text).not.toContain(p.email);
    for (const s of SITES) {
      expect(text).not.toContain(s.name);
      expect(text).not.toContain(s.node.name);
    }
    // Nothing is wider than the phone: no sideways scrolling.
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await screenshot(page, 'public-status-phone');
    await context.close();
  });

  it('reads well on a wide screen too', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    await page.goto(`${server.url}/status`);
    await page.getByTestId('public-summary').waitFor({ timeout: 15_000 });
    await screenshot(page, 'public-status-wide');
    await context.close();
  });
});
