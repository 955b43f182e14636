// The map at the size of a big town: 2,100 nodes in twelve quarters, with 300 live state changes a
// second arriving through the real realtime path (the socket.io PostgreSQL adapter, as a second
// instance would send them). Asserts behaviour; prints the timings as figures ("bench:map").
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { NodeState } from '../../shared/enums';
import { countsIn as countsOf, frameLine, readFrameStats, removeBigTown, seedBigTown, sendStateStorm, startFrameStats, type BigTown } from '../helpers/bigTown';
import fs from 'node:fs';
import path from 'node:path';
import { artifactsDir, screenshot, signInAs, useE2E } from './helpers/browser';

const NODE_COUNT = 2_100;
const EVENTS_PER_S = 300;
const STORM_S = 10;
const ADMIN = 'admin@parapet.example';

const figures: string[] = [];
// The open quarter's list makes the page thousands of pixels tall: the graph's part of the screen is what tells.
const viewShot = (page: import('playwright-core').Page, name: string) => page.screenshot({ path: path.join(artifactsDir, `${name}.png`), timeout: 60_000 });
const note = (line: string) => {
  figures.push(line);
  console.log(`bench:map ${line}`);
};

describe('the map of a 2,100-node town', () => {
  // No scheduled jobs: the big town's nodes change only by the events this file sends.
  const e2e = useE2E({ JOBS_ENABLED: 'false', SOCKET_ADAPTER: 'postgres' });
  const db = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
  let town: BigTown;

  beforeAll(async () => {
    await db.connect();
    const t0 = performance.now();
    town = await seedBigTown(db, NODE_COUNT);
    note(`seeded ${town.nodes.length} nodes and ${town.linkCount} links in ${Math.round(performance.now() - t0)} ms`);
  });
  afterAll(async () => {
    await removeBigTown(db);
    await db.end();
    console.log(['', 'bench:map figures', ...figures.map((f) => `  ${f}`), ''].join('\n'));
  });

  const countsIn = (hoodId: number, states: Map<number, NodeState>) => countsOf(town, hoodId, states);

  it('opens on one mark per quarter with its counts, expands a quarter, and finds a node in a folded one', async () => {
    const page = await e2e.fresh({ width: 1280, height: 900 });
    await signInAs(page, e2e.server.url, ADMIN);
    const states = new Map(town.nodes.map((n) => [n.id, n.state]));

    const t0 = Date.now();
    let answeredAt = 0;
    page.on('response', (res) => {
      if (new URL(res.url()).pathname === '/api/v1/topology') answeredAt = Date.now();
    });
    await page.goto(`${e2e.server.url}/topology`);
    for (const hood of town.neighbourhoods) await page.getByTestId(`topology-hood-${hood.id}`).waitFor({ timeout: 30_000 });
    const drawnAt = Date.now();
    note(`time to the neighbourhood view (navigation to every quarter's mark): ${drawnAt - t0} ms`);
    note(`  of which GET /api/v1/topology answered at ${answeredAt - t0} ms, marks drawn ${drawnAt - answeredAt} ms after the answer`);
    await screenshot(page, 'big-map-neighbourhoods');

    // Each mark carries its quarter's counts by state, and none of the big town's nodes is drawn yet.
    for (const hood of town.neighbourhoods) {
      await expect(page.getByTestId(`topology-hood-${hood.id}`).getAttribute('data-counts')).resolves.toBe(countsIn(hood.id, states));
    }
    await expect(page.locator('[data-testid^="topology-node-"]').count()).resolves.toBeLessThan(100);

    // Enter on a quarter's mark (reached by keyboard) opens it into its nodes.
    const [first, second] = town.neighbourhoods;
    const firstNode = town.nodes.find((n) => n.neighbourhoodId === first.id)!;
    const t1 = Date.now();
    await page.locator(`.react-flow__node[data-id="hood-${first.id}"]`).focus();
    await page.keyboard.press('Enter');
    await page.getByTestId(`topology-node-${firstNode.id}`).waitFor({ timeout: 30_000 });
    note(`time to expand a quarter of ${town.nodes.filter((n) => n.neighbourhoodId === first.id).length} nodes: ${Date.now() - t1} ms`);
    await page.getByTestId(`topology-hood-${first.id}`).waitFor({ state: 'detached' });
    await viewShot(page, 'big-map-quarter-open');

    // Find a node in a folded quarter: that quarter opens, the node is drawn, the panel opens with focus.
    const wanted = [...town.nodes].reverse().find((n) => n.neighbourhoodId === second.id)!;
    const t2 = Date.now();
    await page.getByLabel('Find a node').fill(wanted.name);
    await page.getByRole('button', { name: 'Find', exact: true }).click();
    await page.getByTestId(`topology-node-${wanted.id}`).waitFor({ timeout: 30_000 });
    await page.getByTestId('node-quick-look').waitFor({ timeout: 30_000 });
    await page.waitForFunction(() => Boolean(document.activeElement?.closest('aside')), undefined, { timeout: 15_000 });
    note(`time from Find to the node drawn with its panel: ${Date.now() - t2} ms`);
    expect(page.url()).toContain(`node=${wanted.id}`);
    await page.getByTestId(`topology-hood-${second.id}`).waitFor({ state: 'detached' });
    // The quarter open before folds back (its mark may be off screen, so the list tells which is open).
    await expect(page.getByRole('button', { name: `Hide the nodes of ${second.name}` }).getAttribute('aria-expanded')).resolves.toBe('true');
    await expect(page.getByRole('button', { name: `Show the nodes of ${first.name}` }).getAttribute('aria-expanded')).resolves.toBe('false');
    await expect(
      page
        .getByRole('status')
        .filter({ hasText: `Showing ${wanted.name}` })
        .count(),
    ).resolves.toBe(1);
    await viewShot(page, 'big-map-found');
  }, 180_000);

  it('gets past the graph in few Tab stops, and its list opens a quarter into rows by keyboard', async () => {
    const page = await e2e.fresh({ width: 1280, height: 900 });
    await signInAs(page, e2e.server.url, ADMIN);
    await page.goto(`${e2e.server.url}/topology`);
    await page.getByTestId(`topology-hood-${town.neighbourhoods[0].id}`).waitFor({ timeout: 30_000 });
    await page.getByLabel('Find a node').focus();
    let stops = 0;
    let inList = false;
    for (; stops < 60 && !inList; stops++) {
      await page.keyboard.press('Tab');
      inList = await page.evaluate(() => Boolean(document.activeElement?.closest('[data-testid=topology-list]')));
    }
    note(`Tab stops from the search box to the list past the graph: ${stops}`);
    expect(inList).toBe(true);
    expect(stops).toBeLessThan(40);

    const hood = town.neighbourhoods[2];
    const opener = page.getByRole('button', { name: `Show the nodes of ${hood.name}` });
    await opener.focus();
    await page.keyboard.press('Enter');
    const rows = page.getByTestId(`topology-list-hood-${hood.id}`).locator('[data-testid^="topology-list-node-"]');
    await rows.first().waitFor({ timeout: 15_000 });
    await expect(rows.count()).resolves.toBe(town.nodes.filter((n) => n.neighbourhoodId === hood.id).length);
    await expect(page.getByRole('button', { name: `Hide the nodes of ${hood.name}` }).getAttribute('aria-expanded')).resolves.toBe('true');
  }, 120_000);

  it('keeps frames short while 300 state changes a second arrive, and the marks end on the right counts', async () => {
    const page = await e2e.fresh({ width: 1280, height: 900 });
    await signInAs(page, e2e.server.url, ADMIN);
    await page.goto(`${e2e.server.url}/topology`);
    const open = town.neighbourhoods[0];
    await page.getByTestId(`topology-hood-${open.id}`).waitFor({ timeout: 30_000 });
    await page.locator('[data-testid="live-indicator"][data-status="live"]').waitFor({ timeout: 15_000 });
    await page.getByTestId(`topology-hood-${open.id}`).click();
    const openNodes = town.nodes.filter((n) => n.neighbourhoodId === open.id);
    await page.getByTestId(`topology-node-${openNodes[0].id}`).waitFor({ timeout: 30_000 });

    // Frame gaps by requestAnimationFrame, and long animation frames where the browser reports them.
    await startFrameStats(page);

    // The same figures over 3 s with no events: on a shared machine they show what the load alone costs.
    await page.waitForTimeout(3_000);
    note(`frames with no events (3 s): ${frameLine(await readFrameStats(page))}`);

    // BIG_MAP_PROFILE=1 saves Chromium's CPU profile of the storm (open it in the browser's performance tools).
    const profiler = process.env.BIG_MAP_PROFILE === '1' ? await page.context().newCDPSession(page) : null;
    if (profiler) {
      await profiler.send('Profiler.enable');
      await profiler.send('Profiler.start');
    }

    // 300 events a second through a second socket.io instance on the same PostgreSQL adapter, as from another app instance.
    const storm = await sendStateStorm(process.env.E2E_DATABASE_URL!, town, EVENTS_PER_S, STORM_S);
    if (profiler) {
      const { profile } = await profiler.send('Profiler.stop');
      fs.mkdirSync(artifactsDir, { recursive: true });
      fs.writeFileSync(path.join(artifactsDir, 'big-map-storm.cpuprofile'), JSON.stringify(profile));
    }
    note(`sent ${storm.sent} node:state events in ${storm.seconds.toFixed(1)} s (${Math.round(storm.sent / storm.seconds)}/s)`);

    // Every folded quarter's mark ends on the counts the events left, and the open quarter's nodes on their last state.
    const settledAt = Date.now();
    for (const hood of town.neighbourhoods.slice(1)) {
      const expected = countsIn(hood.id, storm.states);
      await page
        .waitForFunction(
          ([id, want]) => document.querySelector(`[data-testid="topology-hood-${id}"]`)?.getAttribute('data-counts') === want,
          [hood.id, expected] as const,
          // Under heavy machine load the browser works through a backlog of events long after they were sent.
          { timeout: 120_000 },
        )
        .catch(async (error: unknown) => {
          const drawn = await page.evaluate(
            (id) => document.querySelector(`[data-testid="topology-hood-${id}"]`)?.getAttribute('data-counts') ?? 'no mark',
            hood.id,
          );
          throw new Error(`${hood.name}: its mark says ${drawn}, the events left ${expected}`, { cause: error });
        });
    }
    for (const node of openNodes.slice(0, 5)) {
      await page.locator(`[data-testid="topology-node-${node.id}"][data-state="${storm.states.get(node.id)}"]`).waitFor({ timeout: 30_000 });
    }
    note(`marks agreed with the last event ${Date.now() - settledAt} ms after the storm ended`);
    const stats = await readFrameStats(page, true);
    expect(stats.frames).toBeGreaterThan(0);
    note(`frames during the storm: ${frameLine(stats)}`);
    await viewShot(page, 'big-map-after-storm');
  }, 480_000);
});
