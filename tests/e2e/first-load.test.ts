import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { dataUrl, pageData } from '../../src/app/page-data';
import { signInAs, useE2E } from './helpers/browser';

const LONG = 60_000;

/** Every URL the page's own code passed to fetch(), recorded from before its first script runs. */
async function recordFetches(page: Page) {
  await page.addInitScript(() => {
    const seen: string[] = [];
    (window as unknown as { appFetches: string[] }).appFetches = seen;
    const original = window.fetch.bind(window);
    window.fetch = (input: RequestInfo | URL, init?: RequestInit) => {
      const url = new URL(input instanceof Request ? input.url : String(input), window.location.href);
      seen.push(url.pathname + url.search);
      return original(input, init);
    };
  });
}

describe('first load of a page', () => {
  const e2e = useE2E();

  it("asks the network once for each answer the server preloaded, and the page's own fetch takes it", { timeout: 300_000 }, async () => {
    const page = await e2e.fresh();
    await signInAs(page, e2e.server.url, 'admin@parapet.example');
    const context = page.context();
    for (const [pattern, requests] of Object.entries(pageData)) {
      const expected = requests(new URLSearchParams()).map(dataUrl);
      const tab = await context.newPage();
      await recordFetches(tab);
      const onNetwork = new Map<string, number>();
      tab.on('request', (request) => {
        const url = new URL(request.url());
        if (url.pathname.startsWith('/api/')) onNetwork.set(url.pathname + url.search, (onNetwork.get(url.pathname + url.search) ?? 0) + 1);
      });
      const html = await (await tab.goto(`${e2e.server.url}${pattern}`))!.text();
      for (const url of expected) expect(html, pattern).toContain(`href="${url.replaceAll('&', '&amp;')}" as="fetch"`);
      // The page asks for every preloaded URL itself (same string), so none is wasted.
      await tab.waitForFunction((urls) => urls.every((url) => (window as unknown as { appFetches: string[] }).appFetches.includes(url)), expected, {
        timeout: LONG,
        polling: 100,
      });
      await tab.waitForLoadState('networkidle', { timeout: LONG });
      for (const url of expected) expect(onNetwork.get(url), `${pattern}: ${url} on the network`).toBe(1);
      await tab.close();
    }
  });

  it('checks the sign-in form with the shared rules: messages under the fields, the first invalid one focused', { timeout: 120_000 }, async () => {
    const page = await e2e.fresh();
    await page.goto(`${e2e.server.url}/sign-in`);
    await page.getByRole('button', { name: /sign in/i }).click();
    await page.getByText('Some fields need attention.').waitFor({ timeout: LONG });
    expect(await page.getByLabel('E-mail').getAttribute('aria-invalid')).toBe('true');
    expect(await page.getByLabel('Password').getAttribute('aria-invalid')).toBe('true');
    expect(await page.locator('[id$="-error"]').allInnerTexts()).toEqual(['must be an e-mail address', 'is required']);
    expect(await page.evaluate(() => document.activeElement?.getAttribute('type'))).toBe('email');

    await page.getByLabel('E-mail').fill('admin@parapet.example');
    await page.getByRole('button', { name: /sign in/i }).click();
    await page.waitForFunction(() => document.activeElement?.getAttribute('type') === 'password', undefined, { timeout: LONG });
    expect(await page.getByLabel('E-mail').getAttribute('aria-invalid')).toBeNull();
    expect(await page.locator('[id$="-error"]').allInnerTexts()).toEqual(['', 'is required']);
  });
});
