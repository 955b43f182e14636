import { randomUUID } from 'node:crypto';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ServerProcess } from '../../server/tools/serverProcess';
import { launchBrowser, screenshot, signInAs, startE2EServer } from './helpers/browser';

const HEADER = 'name,neighbourhood,latitude,longitude,groundElevationM,antennaHeightM,accessNotes';

describe('importing sites from CSV in the browser', () => {
  let server: ServerProcess;
  let browser: Browser;
  let context: BrowserContext;
  let page: Page;
  const tag = randomUUID().slice(0, 6);
  const names = [`E2E Lantern ${tag}`, `E2E Kite ${tag}`];

  beforeAll(async () => {
    [server, browser] = await Promise.all([startE2EServer(), launchBrowser()]);
    context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    page = await context.newPage();
    await signInAs(page, server.url, 'operator@parapet.example');
  });
  afterAll(async () => {
    // Leave the demo data as it was: remove whatever this test imported.
    if (page) {
      const csrf = (await (await page.request.get(`${server.url}/api/v1/session`)).json()).csrfToken;
      for (const name of names) {
        const found = await (await page.request.get(`${server.url}/api/v1/sites?q=${encodeURIComponent(name)}`)).json();
        for (const s of found.data ?? []) await page.request.delete(`${server.url}/api/v1/sites/${s.id}`, { headers: { 'X-CSRF-Token': csrf } });
      }
    }
    await browser?.close();
    await server?.stop();
  });

  const sitesNamed = async (name: string) =>
    (await (await page.request.get(`${server.url}/api/v1/sites?q=${encodeURIComponent(name)}`)).json()).data as { id: number; name: string }[];
  const choose = (csv: string) => page.getByTestId('import-file').setInputFiles({ name: 'sites.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });

  it('shows the bad row’s error, will not import, and imports nothing', async () => {
    await page.goto(`${server.url}/sites`);
    await page.getByRole('link', { name: 'Import CSV' }).click();
    await page.waitForURL(/\/imports\?kind=sites/);
    await choose([HEADER, `${names[0]},Old Quay,47.6055,-38.4290,9,7,Ring first`, `${names[1]},Old Quay,97.5,-38.4300,,,`].join('\n'));
    await page.getByTestId('import-preview').waitFor();
    expect(await page.getByTestId('import-row-2').innerText()).toContain('latitude must be between -90 and 90');
    expect(await page.getByTestId('import-row-1').innerText()).toContain('Ready');
    expect(await page.getByTestId('import-summary').innerText()).toContain('1 of 2 rows have problems');
    expect(await page.getByRole('button', { name: /^Import 2 sites$/ }).isDisabled()).toBe(true);
    await screenshot(page, 'csv-import-error-row');
    expect(await sitesNamed(names[0])).toEqual([]);
    expect(await sitesNamed(names[1])).toEqual([]);
  });

  it('imports a fixed file, and both sites appear', async () => {
    await choose([HEADER, `${names[0]},Old Quay,47.6055,-38.4290,9,7,Ring first`, `${names[1]},Old Quay,47.6060,-38.4300,,,`].join('\n'));
    await page.getByText('All 2 rows are ready.').waitFor();
    await page.getByRole('button', { name: /^Import 2 sites$/ }).click();
    await page.getByTestId('import-done').waitFor();
    expect(await page.getByTestId('import-done').innerText()).toContain('Imported 2 sites');
    await screenshot(page, 'csv-import-done');
    expect((await sitesNamed(names[0])).map((s) => s.name)).toEqual([names[0]]);
    expect((await sitesNamed(names[1])).map((s) => s.name)).toEqual([names[1]]);
  });
});
