import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startServerProcess, type ServerProcess } from '../../server/tools/serverProcess';
import { startTcpProxy } from '../helpers/tcpProxy';
import { launchBrowser, screenshot, signInAs } from './helpers/browser';

// The server reaches the seeded database through a proxy the test cuts, as a PostgreSQL restart would.
describe('when Parapet cannot reach its database', () => {
  let server: ServerProcess;
  let browser: Browser;
  let proxy: Awaited<ReturnType<typeof startTcpProxy>>;

  beforeAll(async () => {
    const real = new URL(process.env.E2E_DATABASE_URL!);
    proxy = await startTcpProxy(Number(real.port || 5432), real.hostname);
    const viaProxy = new URL(real);
    viaProxy.port = String(proxy.port);
    [server, browser] = await Promise.all([
      startServerProcess(
        {
          DATABASE_URL: viaProxy.toString(),
          CLIENT_DIST: 'dist',
          SESSION_SECRET: 'e2e-session-secret-long-enough',
          SIGNIN_LIMIT_PER_ACCOUNT: '1000',
          DATABASE_PROBE_INTERVAL_MS: '500',
        },
        { timeoutMs: 90_000 },
      ),
      launchBrowser(),
    ]);
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
    await proxy?.close();
  });

  it.each([
    ['wide', { width: 1280, height: 900 }],
    ['phone', { width: 375, height: 812 }],
  ])('shows a banner on the page (%s) while it lasts, and takes it away by itself', async (name, viewport) => {
    const context = await browser.newContext({ viewport });
    const page = await context.newPage();
    await signInAs(page, server.url, 'admin@parapet.example');
    expect(await page.getByTestId('database-banner').count()).toBe(0);

    proxy.set('refuse');
    await page.reload();
    const banner = page.getByTestId('database-banner');
    await banner.waitFor({ timeout: 30_000 });
    expect(await banner.getAttribute('role')).toBe('alert');
    expect(await banner.innerText()).toMatch(/cannot reach its database/);
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await screenshot(page, `database-banner-${name}`);

    proxy.set('pass');
    await banner.waitFor({ state: 'detached', timeout: 30_000 });
    await page.getByTestId('user-menu').waitFor({ timeout: 15_000 });
    await context.close();
  });
});
