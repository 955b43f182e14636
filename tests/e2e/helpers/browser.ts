import fs from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { startServerProcess, type ServerProcess } from '../../../server/tools/serverProcess';

export const DEMO_PASSWORD = process.env.PARAPET_DEMO_PASSWORD ?? 'parapet-demo';
export const artifactsDir = path.resolve(process.env.TEST_ARTIFACTS_DIR ?? 'test-artifacts');

/** Debian's chromium, driven headless; no browser is ever downloaded. */
export async function launchBrowser(): Promise<Browser> {
  const executablePath = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
  if (!fs.existsSync(executablePath)) throw new Error(`No browser at ${executablePath}: install Debian's chromium (docker-free-scripts/test.sh does).`);
  return chromium.launch({
    executablePath,
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

/** The real server, serving the built client, on the seeded end-to-end database. */
export async function startE2EServer(extraEnv: Record<string, string> = {}): Promise<ServerProcess> {
  const url = process.env.E2E_DATABASE_URL;
  if (!url) throw new Error('E2E_DATABASE_URL must point at a migrated, seeded database (docker-free-scripts/test.sh sets it).');
  if (!fs.existsSync(path.resolve('dist/index.html'))) throw new Error('The client is not built: run `npm run build` first (test.sh does).');
  return startServerProcess({
    DATABASE_URL: url,
    CLIENT_DIST: 'dist',
    SESSION_SECRET: 'e2e-session-secret-long-enough',
    SIGNIN_LIMIT_PER_ACCOUNT: '1000',
    SIGNIN_LIMIT_PER_ACCOUNT_ADDRESS: '1000',
    SIGNIN_LIMIT_PER_ADDRESS: '10000',
    ...extraEnv,
  });
}

export async function screenshot(page: Page, name: string) {
  fs.mkdirSync(artifactsDir, { recursive: true });
  await page.screenshot({ path: path.join(artifactsDir, `${name}.png`), fullPage: true });
}

export async function signInAs(page: Page, baseUrl: string, email: string) {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel(/e-?mail/i).fill(email);
  await page.getByLabel(/password/i).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: /sign in/i }).click();
  await page.getByTestId('user-menu').waitFor({ timeout: 15_000 });
}

export interface E2ESession {
  server: ServerProcess;
  browser: Browser;
  page: Page;
  /** A new browser context (fresh cookies) and page, at the given size. */
  fresh: (viewport?: { width: number; height: number }) => Promise<Page>;
}

/** One server and one browser for a test file, started before its tests and stopped after them. */
export function useE2E(extraEnv: Record<string, string> = {}): E2ESession {
  let context: BrowserContext | null = null;
  const session = {
    async fresh(viewport = { width: 1280, height: 900 }) {
      await context?.close();
      context = await session.browser.newContext({ viewport });
      session.page = await context.newPage();
      return session.page;
    },
  } as E2ESession;
  beforeAll(async () => {
    [session.server, session.browser] = await Promise.all([startE2EServer(extraEnv), launchBrowser()]);
  });
  afterAll(async () => {
    await session.browser?.close();
    await session.server?.stop();
  });
  return session;
}
