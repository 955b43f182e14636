import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { screenshot, signInAs, useE2E } from './helpers/browser';

/**
 * Walks the console the way a person does: one browser context, one page, moving by the app's own links, so
 * the query cache carries over from page to page (fresh contexts per page hide cache-shape clashes).
 */
describe('a walk through the console in one session', () => {
  const e2e = useE2E();

  /** Every uncaught error, console error and 5xx answer while walking; the walk fails on any. */
  function watch(page: Page) {
    const problems: string[] = [];
    page.on('pageerror', (e) => problems.push(`page error on ${page.url()}: ${e.message}`));
    page.on('console', (m) => {
      if (m.type() === 'error') problems.push(`console error on ${page.url()}: ${m.text()}`);
    });
    page.on('response', (r) => {
      if (r.status() >= 500) problems.push(`${r.status()} from ${r.request().method()} ${r.url()}`);
    });
    return problems;
  }

  /** The page has settled: its title is shown (or the error screen, which fails the step with what was caught), no loader is left. */
  async function settled(page: Page, title: string | RegExp, step: string, problems: string[]) {
    const errorScreen = page.getByText('This page ran into a problem');
    await page.getByRole('heading', { level: 1, name: title }).or(errorScreen).first().waitFor({ timeout: 20_000 });
    expect(await errorScreen.count(), `${step}: error screen; caught ${JSON.stringify(problems)}`).toBe(0);
    await expect.poll(() => page.locator('p[role="status"]').count(), { timeout: 20_000, message: `${step}: loaders left` }).toBe(0);
    // A failed read shows as a div[role=alert] (query-state.tsx LoadError); warnings inside pages are not divs.
    expect(await page.locator('div[role="alert"]').count(), `${step}: load error shown`).toBe(0);
  }

  const nav = (page: Page, label: string) => page.getByTestId('nav').getByRole('link', { name: label, exact: true }).click();
  // The person's own pages sit behind their name, in a drop-down that closes on each page change.
  const userMenu = async (page: Page, label: string) => {
    await page
      .getByTestId('user-menu')
      .getByRole('button', { name: /your pages/ })
      .click();
    await page.getByTestId('user-menu').getByRole('link', { name: label, exact: true }).click();
  };
  const planningTo = async (page: Page, title: string, problems: string[]) => {
    await nav(page, 'Planning');
    await settled(page, 'Planning', 'planning index', problems);
    await page
      .getByTestId('planning-index')
      .getByRole('link', { name: new RegExp(`^${title}`) })
      .click();
    await settled(page, title, title, problems);
  };

  it('visits every page of an admin’s console, node pages between planning pages, without an error', async () => {
    const page = await e2e.fresh();
    const problems = watch(page);
    await signInAs(page, e2e.server.url, 'admin@parapet.example');
    await settled(page, 'Overview', 'overview', problems);

    // A node page fills the inventory lists' cache; the planning pages read the same keys next.
    await nav(page, 'Nodes');
    await settled(page, 'Nodes', 'nodes', problems);
    await page.getByRole('link', { name: 'lf-mill', exact: true }).click();
    await settled(page, /lf-mill/, 'node page', problems);
    await page.getByTestId('radios-table').waitFor();
    await planningTo(page, 'Channel plan', problems);
    await page.getByTestId('channel-plan-table').waitFor();
    await planningTo(page, 'Link budget', problems);
    await page.getByLabel('Site A', { exact: true }).locator('option', { hasText: 'Granary Tower' }).waitFor({ state: 'attached' });
    await planningTo(page, 'Address plan', problems);
    await planningTo(page, 'Security review', problems);

    await nav(page, 'Sites');
    await settled(page, 'Sites', 'sites', problems);
    await page.getByRole('link', { name: 'Granary Tower', exact: true }).click();
    await settled(page, 'Granary Tower', 'site page', problems);
    await page.getByRole('link', { name: 'lf-granary' }).first().click();
    await settled(page, /lf-granary/, 'node page from the site', problems);
    await page.getByRole('link', { name: 'Show on the map' }).click();
    await settled(page, 'Network map', 'map', problems);
    await page.getByTestId('node-links').waitFor();

    for (const [label, title] of [
      ['Overview', 'Overview'],
      ['Outages', 'Outages'],
      ['Neighbourhoods', 'Neighbourhoods'],
      ['Reports', 'Availability report'],
      ['People', 'People'],
    ] as const) {
      await nav(page, label);
      await settled(page, title, label, problems);
    }
    await nav(page, 'Neighbourhoods');
    await settled(page, 'Neighbourhoods', 'neighbourhoods again', problems);
    await page.getByRole('link', { name: 'Millbrook', exact: true }).click();
    await settled(page, 'Millbrook', 'neighbourhood page', problems);

    for (const [label, title] of [
      ['Account', 'Your account'],
      ['Mail settings', 'Mail preferences'],
      ['Outbox', 'Outbox'],
      ['History', 'History'],
    ] as const) {
      await userMenu(page, label);
      await settled(page, title, label, problems);
    }

    // Back and forward through the history, then the crash path once more: node page, then the channel plan.
    await page.goBack();
    await settled(page, 'Outbox', 'back', problems);
    await page.goForward();
    await settled(page, 'History', 'forward', problems);
    await nav(page, 'Nodes');
    await settled(page, 'Nodes', 'nodes again', problems);
    await page.getByRole('link', { name: 'lf-quay', exact: true }).click();
    await settled(page, /lf-quay/, 'second node page', problems);
    await planningTo(page, 'Channel plan', problems);
    await page.getByLabel('Band', { exact: true }).selectOption('5');
    await page.getByTestId('channel-plan-table').waitFor();
    await settled(page, 'Channel plan', 'channel plan, 5 GHz', problems);
    await screenshot(page, 'walk-end-channel-plan');

    expect(problems).toEqual([]);
  }, 300_000); // some thirty pages; a loaded machine takes minutes, and no speed is asserted here

  it('walks an operator at phone width from a node page to the channel plan and back without an error', async () => {
    const page = await e2e.fresh({ width: 375, height: 800 });
    const problems = watch(page);
    await signInAs(page, e2e.server.url, 'operator@parapet.example');
    await settled(page, 'Overview', 'overview', problems);
    const menu = page.getByRole('button', { name: /menu/i });
    const openMenu = async () => {
      if (await menu.count()) await menu.first().click();
    };
    await openMenu();
    await nav(page, 'Nodes');
    await settled(page, 'Nodes', 'nodes', problems);
    await page.getByRole('link', { name: 'lf-cooper', exact: true }).click();
    await settled(page, /lf-cooper/, 'node page', problems);
    await openMenu();
    await nav(page, 'Planning');
    await settled(page, 'Planning', 'planning', problems);
    await page
      .getByTestId('planning-index')
      .getByRole('link', { name: /^Channel plan/ })
      .click();
    await settled(page, 'Channel plan', 'channel plan', problems);
    await page.getByTestId('channel-plan-table').waitFor();
    await page.goBack();
    await page.goBack();
    await settled(page, /lf-cooper/, 'node page again', problems);
    await screenshot(page, 'walk-operator-375');
    expect(problems).toEqual([]);
  }, 180_000);
});
