import fs from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { screenshot, signInAs, useE2E } from './helpers/browser';

// axe-core's own build, evaluated in the page (the app's content security policy would refuse it as a <script>).
const axeSource = fs.readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
// Whole-site walks take minutes on a loaded machine; each has its own budget below.
const WCAG_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'];

/** The page has drawn its heading and finished its first reads (no "Loading…" left). */
async function settled(page: Page) {
  try {
    // Generous: the security review judges every key on the server, which takes seconds on a loaded machine.
    await page.locator('h1').first().waitFor({ timeout: 90_000 });
    await page.waitForFunction(
      () => ![...document.querySelectorAll('[role=status]')].some((el) => /^Loading|^Checking/.test(el.textContent ?? '')),
      undefined,
      { timeout: 90_000 },
    );
  } catch (error) {
    throw new Error(`${page.url()} did not finish loading: ${(error as Error).message.split('\n')[0]}`, { cause: error });
  }
}

async function axeViolations(page: Page): Promise<string[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.evaluate(axeSource);
  const violations = await page.evaluate(async (tags) => {
    const axe = (
      window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<{ violations: { id: string; nodes: { target: string[] }[] }[] }> } }
    ).axe;
    const result = await axe.run(document, { runOnly: { type: 'tag', values: tags }, resultTypes: ['violations'] });
    return result.violations.map(
      (v) =>
        `${v.id}: ${v.nodes
          .map((n) => n.target.join(' '))
          .slice(0, 5)
          .join(', ')}`,
    );
  }, WCAG_TAGS);
  return violations;
}

async function setTheme(page: Page, theme: 'light' | 'dark') {
  await page.evaluate((t) => localStorage.setItem('parapet-theme', t), theme);
}

/** What has focus now: its tag, name, whether it is on screen and whether a ring is drawn around it. */
function focused(page: Page) {
  return page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) return null;
    // A time or month field passes focus through its own parts (hour, minute, its picker), which the
    // browser highlights itself; the field is ringed while one of its parts has focus (`:focus`).
    const insideOwnParts = !el.matches(':focus');
    const box = el.getBoundingClientRect();
    const style = getComputedStyle(el);
    const ringPx = style.outlineStyle === 'none' ? 0 : parseFloat(style.outlineWidth);
    // On screen and not covered by something else (an open menu, say).
    const x = Math.min(Math.max(box.left + box.width / 2, 0), innerWidth - 1);
    const y = Math.min(Math.max(box.top + box.height / 2, 0), innerHeight - 1);
    const top = document.elementFromPoint(x, y);
    return {
      tag: el.tagName.toLowerCase(),
      text: (el.getAttribute('aria-label') ?? el.textContent ?? '').trim().slice(0, 60),
      visible: box.width > 0 && box.height > 0 && box.bottom > 0 && box.top < innerHeight,
      uncovered: top !== null && (el === top || el.contains(top) || top.contains(el)),
      ringPx,
      inNav: Boolean(el.closest('nav')),
      inAside: Boolean(el.closest('aside')),
      insideOwnParts,
    };
  });
}

/** The most Tab stops a page may have: past this, crossing it by keyboard is a chore (the map is walked in its own test). */
const TAB_STOPS_LIMIT = 80;

const ADMIN_PAGES = [
  '/',
  '/topology',
  '/outages',
  '/nodes',
  '/sites',
  '/neighbourhoods',
  '/reports',
  '/planning',
  '/planning/link-budget',
  '/planning/channels',
  '/planning/addresses',
  '/planning/security',
  '/people',
  '/imports',
  '/preferences',
  '/account',
  '/history',
  '/outbox',
];

describe('every page with a keyboard and a screen reader', () => {
  const e2e = useE2E();

  it('finds no WCAG 2.0–2.2 A/AA violation on the signed-out pages, in either theme', async () => {
    const page = await e2e.fresh({ width: 1280, height: 900 });
    const found: string[] = [];
    for (const theme of ['light', 'dark'] as const) {
      await page.goto(`${e2e.server.url}/sign-in`);
      await setTheme(page, theme);
      for (const path of ['/status', '/sign-in', '/forgot-password']) {
        await page.goto(`${e2e.server.url}${path}`);
        await settled(page);
        for (const v of await axeViolations(page)) found.push(`${theme} ${path} ${v}`);
      }
    }
    expect(found).toEqual([]);
    // Every neighbourhood card on the status page has a name of its own (its heading).
    await page.goto(`${e2e.server.url}/status`);
    await settled(page);
    const cards = page.getByTestId('public-neighbourhood');
    const count = await cards.count();
    expect(count).toBeGreaterThan(1);
    for (let i = 0; i < count; i++) {
      const heading = await cards.nth(i).locator('h2').innerText();
      await expect(page.getByRole('article', { name: heading, exact: true }).count()).resolves.toBe(1);
    }
  }, 600_000);

  it('finds no WCAG 2.0–2.2 A/AA violation on any signed-in page, in either theme', async () => {
    const page = await e2e.fresh({ width: 1280, height: 900 });
    await signInAs(page, e2e.server.url, 'admin@parapet.example');
    const nodeId = await page.evaluate(async () => (await (await fetch('/api/v1/nodes?pageSize=1')).json()).data[0].id as number);
    const siteId = await page.evaluate(async () => (await (await fetch('/api/v1/sites?pageSize=1')).json()).data[0].id as number);
    const hoodId = await page.evaluate(async () => (await (await fetch('/api/v1/neighbourhoods?pageSize=1')).json()).data[0].id as number);
    const pages = [...ADMIN_PAGES, `/nodes/${nodeId}`, `/sites/${siteId}`, `/neighbourhoods/${hoodId}`, `/topology?node=${nodeId}`];
    const found: string[] = [];
    for (const theme of ['light', 'dark'] as const) {
      await setTheme(page, theme);
      for (const path of pages) {
        await page.goto(`${e2e.server.url}${path}`);
        await settled(page);
        for (const v of await axeViolations(page)) found.push(`${theme} ${path} ${v}`);
      }
    }
    await setTheme(page, 'light');
    expect(found).toEqual([]);
  }, 600_000);

  it('walks every signed-in page by Tab to its end: each stop is on screen, uncovered and ringed', async () => {
    const page = await e2e.fresh({ width: 1280, height: 900 });
    await signInAs(page, e2e.server.url, 'admin@parapet.example');
    const nodeId = await page.evaluate(async () => (await (await fetch('/api/v1/nodes?pageSize=1')).json()).data[0].id as number);
    const siteId = await page.evaluate(async () => (await (await fetch('/api/v1/sites?pageSize=1')).json()).data[0].id as number);
    const problems: string[] = [];
    const counts: string[] = [];
    for (const path of [...ADMIN_PAGES.filter((p) => p !== '/topology'), `/nodes/${nodeId}`, `/sites/${siteId}`]) {
      await page.goto(`${e2e.server.url}${path}`);
      await settled(page);
      let stops = 0;
      let ended = false;
      // A walk must reach the end of the page (focus back on the document): a page with more stops than this
      // is too long to cross by keyboard and needs grouping (a roving focus, a "skip" link), not a bigger number.
      for (let i = 0; i < TAB_STOPS_LIMIT; i++) {
        await page.keyboard.press('Tab');
        const f = await focused(page);
        if (!f) {
          ended = true; // past the last control, back to the document
          break;
        }
        stops++;
        if (!f.visible || !f.uncovered) problems.push(`${path}: Tab ${i + 1} on <${f.tag}> "${f.text}" is hidden`);
        if (f.ringPx < 2 && !f.insideOwnParts) problems.push(`${path}: Tab ${i + 1} on <${f.tag}> "${f.text}" shows no focus ring`);
      }
      counts.push(`${path} ${stops}`);
      if (!ended) problems.push(`${path}: the Tab walk did not reach the end of the page within ${TAB_STOPS_LIMIT} stops`);
      // The skip link, the brand, the menu and the person's controls come first on every page.
      expect(stops, path).toBeGreaterThan(5);
    }
    console.log(`Tab stops per page: ${counts.join(', ')}`);
    expect(problems).toEqual([]);
  }, 900_000);

  it('opens the phone menu by keyboard, tabs into its links, and closes it with Escape back on the button', async () => {
    const page = await e2e.fresh({ width: 375, height: 740 });
    await signInAs(page, e2e.server.url, 'admin@parapet.example');
    await settled(page);
    const menuButton = page.getByRole('button', { name: 'Menu' });
    await menuButton.focus();
    await page.keyboard.press('Enter');
    await expect(menuButton.getAttribute('aria-expanded')).resolves.toBe('true');
    await page.keyboard.press('Tab');
    const first = await focused(page);
    expect(first).toMatchObject({ inNav: true, visible: true, uncovered: true, text: 'Overview' });
    await screenshot(page, 'a11y-phone-menu-open');
    await page.keyboard.press('Escape');
    await expect(menuButton.getAttribute('aria-expanded')).resolves.toBe('false');
    await expect(page.evaluate(() => document.activeElement?.textContent?.trim())).resolves.toBe('Menu');
    await expect(page.getByTestId('nav').isVisible()).resolves.toBe(false);
  });

  it('shows the person menu whole at 1024 and 1280 px, and Escape returns focus to it', async () => {
    for (const width of [1024, 1280]) {
      const page = await e2e.fresh({ width, height: 800 });
      await signInAs(page, e2e.server.url, 'admin@parapet.example');
      await settled(page);
      const opener = page.getByRole('button', { name: /Marta Quillon/ });
      await opener.focus();
      await page.keyboard.press('Enter');
      for (const name of ['Account', 'Mail settings', 'Outbox', 'History']) {
        const link = page.getByRole('link', { name, exact: true });
        const whole = await link.evaluate((el) => {
          const box = el.getBoundingClientRect();
          return el.scrollWidth <= el.clientWidth && box.left >= 0 && box.right <= innerWidth && box.width > 20;
        });
        expect(whole, `${name} at ${width} px`).toBe(true);
      }
      await page.keyboard.press('Tab');
      expect(await focused(page)).toMatchObject({ text: 'Account', visible: true, uncovered: true });
      expect((await focused(page))!.ringPx).toBeGreaterThanOrEqual(3);
      await screenshot(page, `a11y-person-menu-${width}`);
      await page.keyboard.press('Escape');
      await expect(page.getByRole('link', { name: 'Outbox', exact: true }).isVisible()).resolves.toBe(false);
      await expect(page.evaluate(() => document.activeElement?.getAttribute('aria-expanded'))).resolves.toBe('false');
    }
  });

  it('moves focus to the new page’s heading and says its name after a page change', async () => {
    const page = await e2e.fresh({ width: 1280, height: 900 });
    await signInAs(page, e2e.server.url, 'admin@parapet.example');
    await settled(page);
    await page.getByTestId('nav').getByRole('link', { name: 'Nodes' }).focus();
    await page.keyboard.press('Enter');
    await page.waitForURL(/\/nodes$/);
    await page.waitForFunction(() => document.querySelector('[data-testid=route-announcer]')?.textContent === 'Nodes', undefined, { timeout: 15_000 });
    await expect(page.evaluate(() => document.activeElement?.tagName)).resolves.toBe('H1');
  });

  it('puts focus in the form after "Add node" and back on the button after Cancel', async () => {
    const page = await e2e.fresh({ width: 1280, height: 900 });
    await signInAs(page, e2e.server.url, 'admin@parapet.example');
    await page.goto(`${e2e.server.url}/nodes`);
    await settled(page);
    await page.getByRole('button', { name: 'Add node' }).focus();
    await page.keyboard.press('Enter');
    await page.waitForFunction(() => document.activeElement?.tagName === 'INPUT' || document.activeElement?.tagName === 'SELECT', undefined, {
      timeout: 15_000,
    });
    await page.getByRole('button', { name: 'Cancel' }).focus();
    await page.keyboard.press('Enter');
    await page.waitForFunction(() => document.activeElement?.textContent?.trim() === 'Add node', undefined, { timeout: 15_000 });
  });

  it('selects a map node by keyboard: a ring on the focused node, Enter opens its panel, Find moves focus there too', async () => {
    const page = await e2e.fresh({ width: 1280, height: 900 });
    await signInAs(page, e2e.server.url, 'admin@parapet.example');
    await page.goto(`${e2e.server.url}/topology`);
    await settled(page);
    await page.locator('.react-flow__node').first().waitFor({ timeout: 30_000 });
    // Every link whose margin is not comfortable carries its band's sign, not colour alone.
    const marks = await page.evaluate(() => ({
      flagged: document.querySelectorAll('line[data-margin]:not([data-margin=comfortable])').length,
      marked: document.querySelectorAll('[data-testid^=topology-link-mark-]').length,
      bands: [...new Set([...document.querySelectorAll('line[data-margin]')].map((l) => l.getAttribute('data-margin')))],
    }));
    expect(marks.bands.length).toBeGreaterThan(1);
    expect(marks.marked).toBe(marks.flagged);
    // Tab until a graph node has focus.
    let onNode = false;
    for (let i = 0; i < 40 && !onNode; i++) {
      await page.keyboard.press('Tab');
      onNode = await page.evaluate(() => Boolean(document.activeElement?.classList.contains('react-flow__node')));
    }
    expect(onNode).toBe(true);
    const ring = await focused(page);
    expect(ring!.ringPx).toBeGreaterThanOrEqual(3);
    // The node's own title reads "<name> at <site>: <state>…".
    const name = (await page.evaluate(() => document.activeElement?.querySelector('[title]')?.getAttribute('title')))!.split(' at ')[0];
    await page.keyboard.press('Enter');
    await page.waitForURL(/node=\d+/, { timeout: 15_000 });
    await page.getByTestId('node-quick-look').waitFor({ timeout: 15_000 });
    await screenshot(page, 'a11y-map-node-chosen');
    await page.waitForFunction(() => Boolean(document.activeElement?.closest('aside')), undefined, { timeout: 15_000 });
    await expect(
      page
        .getByRole('status')
        .filter({ hasText: `Showing ${name}` })
        .count(),
    ).resolves.toBe(1);
    expect(page.url()).toMatch(/node=\d+/);
    // Closing the panel returns focus to the node in the graph.
    await page.getByRole('button', { name: 'Close the node panel' }).focus();
    await page.keyboard.press('Enter');
    await page.waitForFunction(() => Boolean(document.activeElement?.classList.contains('react-flow__node')), undefined, { timeout: 15_000 });

    await page.getByLabel('Find a node').fill(name);
    await page.keyboard.press('Enter');
    await page.waitForFunction(() => Boolean(document.activeElement?.closest('aside')), undefined, { timeout: 15_000 });
    await expect(page.getByTestId('node-quick-look').locator('h2').innerText()).resolves.toBe(name);
  });
});
