import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ServerProcess } from '../../server/tools/serverProcess';
import { launchBrowser, screenshot, signInAs, startE2EServer } from './helpers/browser';

describe('what each role sees in the browser', () => {
  let server: ServerProcess;
  let browser: Browser;
  let context: BrowserContext;
  let page: Page;

  beforeAll(async () => {
    [server, browser] = await Promise.all([startE2EServer(), launchBrowser()]);
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });
  const fresh = async (viewport = { width: 1280, height: 900 }) => {
    await context?.close();
    context = await browser.newContext({ viewport });
    page = await context.newPage();
  };

  it('sends a signed-out visitor to sign-in and refuses a wrong password with a message', async () => {
    await fresh();
    await page.goto(`${server.url}/sites`);
    await page.waitForURL(/\/sign-in/);
    await page.getByLabel(/e-?mail/i).fill('admin@parapet.example');
    await page.getByLabel(/password/i).fill('not-the-password');
    await page.getByRole('button', { name: /sign in/i }).click();
    await page.getByText('That e-mail and password do not match an active account.').waitFor();
    await screenshot(page, 'sign-in-refused');
  });

  it('shows an admin every neighbourhood, the people page and the counts by state', async () => {
    await fresh();
    await signInAs(page, server.url, 'admin@parapet.example');
    expect(await page.getByTestId('user-menu').innerText()).toMatch(/Marta Quillon/);
    await page.getByTestId('overview-counts').waitFor();
    expect(await page.getByTestId('overview-counts').innerText()).toMatch(/unknown|online/i);
    await screenshot(page, 'admin-overview');
    await page.goto(`${server.url}/neighbourhoods`);
    for (const name of ['Old Quay', 'Millbrook', 'Saltmarsh Row', 'Chapel Hill']) await page.getByText(name, { exact: true }).first().waitFor();
    await page.goto(`${server.url}/people`);
    await page.getByTestId('people-table').waitFor();
    expect(await page.getByTestId('people-table').innerText()).toContain('host@parapet.example');
    await screenshot(page, 'admin-people');
  });

  it('shows an operator only their neighbourhoods’ sites and no people page', async () => {
    await fresh();
    await signInAs(page, server.url, 'operator@parapet.example');
    expect(await page.getByTestId('nav').innerText()).not.toMatch(/People/);
    await page.goto(`${server.url}/sites?pageSize=100`);
    await page.getByTestId('sites-table').waitFor();
    await page.getByText('Granary Tower').first().waitFor();
    const text = await page.getByTestId('sites-table').innerText();
    expect(text).toContain('Mill Race Terrace'); // Millbrook, assigned
    expect(text).not.toContain('Reedbed Bungalow'); // Saltmarsh Row, not assigned
    expect(text).not.toContain('Belfry Lane 5'); // Chapel Hill, not assigned
    await screenshot(page, 'operator-sites');
  });

  it('shows a host only the sites they host, on a phone-sized screen', async () => {
    await fresh({ width: 375, height: 760 });
    await signInAs(page, server.url, 'host@parapet.example');
    await page.goto(`${server.url}/sites`);
    await page.getByText('Quay Chandlery').first().waitFor();
    const body = await page.locator('main').innerText();
    expect(body).toContain('Yew Tree House');
    expect(body).not.toContain('Granary Tower');
    expect(body).not.toContain('Mill Race Terrace');
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await screenshot(page, 'host-sites-phone');
  });
});
