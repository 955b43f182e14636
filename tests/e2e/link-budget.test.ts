import { describe, expect, it } from 'vitest';
import { screenshot, signInAs, useE2E } from './helpers/browser';

describe('planning in the browser', () => {
  const e2e = useE2E();

  async function pickEnd(end: 'A' | 'B', siteName: string) {
    const site = e2e.page.getByLabel(`Site ${end}`, { exact: true });
    await site.locator('option', { hasText: siteName }).first().waitFor({ state: 'attached' });
    await site.selectOption({ label: siteName });
    const node = e2e.page.getByLabel(`Node ${end}`, { exact: true });
    await expect.poll(() => node.locator('option').count(), { timeout: 10_000 }).toBeGreaterThan(1);
    await node.selectOption({ index: 1 });
    return Number(await node.inputValue());
  }

  it('computes a link budget between two demo sites, saves it and finds it dashed on the map', async () => {
    await e2e.fresh();
    await signInAs(e2e.page, e2e.server.url, 'admin@parapet.example');
    await e2e.page.getByTestId('nav').getByRole('link', { name: 'Planning' }).click();
    await e2e.page
      .getByTestId('planning-index')
      .getByRole('link', { name: /Link budget/ })
      .click();
    await e2e.page.waitForURL(/\/planning\/link-budget$/);
    const nodeA = await pickEnd('A', 'Granary Tower');
    const nodeB = await pickEnd('B', 'Millbrook Mill');
    // A building across the path 1 km from A, its top well above both masts: the side view draws it and the verdict says blocked.
    await e2e.page.getByRole('button', { name: 'Add obstacle' }).click();
    await e2e.page.getByLabel('Obstacle 1 distance from A (km)').fill('1');
    await e2e.page.getByLabel('Obstacle 1 top height (m)').fill('400');
    await e2e.page.getByRole('button', { name: 'Compute link budget' }).click();
    await e2e.page.getByTestId('link-verdict').waitFor();
    expect(await e2e.page.getByTestId('link-verdict').innerText()).toMatch(/At risk — line of sight blocked/);
    expect(await e2e.page.getByTestId('link-warnings').innerText()).toMatch(/Line of sight blocked at k = 4\/3: 1\.0 km from a/);
    await e2e.page.getByTestId('profile-obstacle').first().waitFor({ state: 'attached' });
    expect(await e2e.page.getByTestId('link-budget-figures').innerText()).toMatch(/Diffraction loss \(worst obstacle\)\s+[1-9][\d.]* dB/);
    await screenshot(e2e.page, 'link-budget-obstacle-1280');
    await e2e.page.getByRole('button', { name: 'Remove' }).click();
    await e2e.page.getByRole('button', { name: 'Compute link budget' }).click();
    await expect.poll(() => e2e.page.getByTestId('profile-obstacle').count(), { timeout: 15_000 }).toBe(0);
    await e2e.page.getByTestId('link-verdict').waitFor();
    const figures = await e2e.page.getByTestId('link-budget-figures').innerText();
    // The demo places Millbrook Mill 150 m north and 2100 m east of Granary Tower: about 2.1 km.
    const km = Number(/Distance\s+([\d.]+) km/.exec(figures)?.[1]);
    expect(km).toBeGreaterThan(2.0);
    expect(km).toBeLessThan(2.25);
    expect(figures).toMatch(/Free-space path loss\s+[\d.]+ dB/);
    // One scale with the map's legend: Comfortable, Thin or At risk.
    expect(await e2e.page.getByTestId('link-verdict').innerText()).toMatch(/Comfortable|Thin|At risk/);
    expect(await e2e.page.getByTestId('regulatory-verdict').innerText()).toMatch(/EU rules|not available/);
    expect(await e2e.page.getByTestId('width-trade-off').innerText()).toMatch(/20 MHz[\s\S]*40 MHz[\s\S]*80 MHz/);
    expect(await e2e.page.getByText(/RF exposure/).count()).toBeGreaterThan(0);
    await e2e.page.getByTestId('path-profile').locator('svg polygon').waitFor();
    await screenshot(e2e.page, 'link-budget-1280');

    const saved = e2e.page.waitForResponse((r) => r.url().endsWith('/api/v1/planning/planned-links') && r.request().method() === 'POST');
    await e2e.page.getByRole('button', { name: 'Save as planned link' }).click();
    const response = await saved;
    expect(response.status()).toBe(201);
    const link = (await response.json()).data as { id: number; status: string; nodeAId: number; nodeBId: number };
    expect(link).toMatchObject({ status: 'planned', nodeAId: nodeA, nodeBId: nodeB });
    await e2e.page.getByTestId('saved-link').waitFor();

    const topo = await e2e.page.request.get(`${e2e.server.url}/api/v1/topology`);
    const edge = ((await topo.json()).data.links as { id: number; status: string }[]).find((l) => l.id === link.id);
    expect(edge?.status).toBe('planned');

    await e2e.page.goto(`${e2e.server.url}/topology`);
    await e2e.page.getByTestId(`topology-node-${nodeA}`).waitFor();
    await e2e.page.getByTestId(`topology-node-${nodeB}`).waitFor();
    const line = e2e.page.getByTestId(`topology-link-${link.id}`);
    await line.waitFor({ state: 'attached' });
    // A planned link is drawn dashed, 3 parts line to 2.5 parts gap (not solid, not the dotted "heard on the air" line).
    const dash = (await line.getAttribute('stroke-dasharray')) ?? '';
    expect(dash).toMatch(/^\d+(\.\d+)? \d+(\.\d+)?$/);
    const [on, off] = dash.split(' ').map(Number);
    expect(off / on).toBeCloseTo(2.5 / 3, 1);
    await screenshot(e2e.page, 'link-budget-saved-on-topology');
  }, 180_000);

  const PAGES = [
    ['link-budget', '/planning/link-budget', 'link-end-a'],
    ['index', '/planning', 'planning-index'],
    ['channels', '/planning/channels', 'channel-plan-table'],
    ['addresses', '/planning/addresses', 'address-plan-table'],
    ['security', '/planning/security', 'security-radios'],
  ] as const;
  it.each([1280, 375])(
    'shows every planning page to an operator at %i px',
    async (width) => {
      await e2e.fresh({ width, height: 900 });
      await signInAs(e2e.page, e2e.server.url, 'operator@parapet.example');
      for (const [name, url, testId] of PAGES) {
        await e2e.page.goto(`${e2e.server.url}${url}`);
        await e2e.page.getByTestId(testId).waitFor();
        if (name === 'channels') {
          // A survey uploaded through the page: one bad row is listed with its line, the rest is charted.
          await e2e.page.getByLabel('Node surveyed').selectOption({ index: 1 });
          await e2e.page.getByLabel(/Survey file/).setInputFiles({
            name: 'rooftop-scan.csv',
            mimeType: 'text/csv',
            buffer: Buffer.from('ssid,channel,channelWidthMHz,signalDbm\nBakery Guest,1,20,-48\nLibrary,6,20,-77\nBroken,15,20,-60\n'),
          });
          await e2e.page.getByRole('button', { name: 'Upload survey' }).click();
          await e2e.page
            .getByText(/Line 4: channel 15 is not a Wi-Fi channel/)
            .waitFor({ timeout: 10_000 })
            .catch(async (e) => {
              await screenshot(e2e.page, 'debug-upload');
              throw e;
            });
          await e2e.page.getByTestId('congestion-chart').first().waitFor();
        }
        await screenshot(e2e.page, `planning-${name}-${width}`);
        expect(await e2e.page.getByTestId(name === 'link-budget' ? 'link-end-a' : 'planning-caution').count()).toBeGreaterThan(0);
      }
    },
    180_000,
  );

  it('shows a provisioning sheet with the key to the neighbourhood’s operator', async () => {
    for (const width of [1280, 375]) {
      await e2e.fresh({ width, height: 900 });
      await signInAs(e2e.page, e2e.server.url, 'operator@parapet.example');
      const nodes = await (await e2e.page.request.get(`${e2e.server.url}/api/v1/nodes?q=mill&pageSize=5`)).json();
      const node = (nodes.data as { id: number; name: string }[])[0];
      await e2e.page.goto(`${e2e.server.url}/nodes/${node.id}/provisioning`);
      await e2e.page.getByTestId('provisioning-sheet').waitFor();
      const text = await e2e.page.getByTestId('provisioning-sheet').innerText();
      expect(text).toMatch(/RF exposure/);
      expect(text).toMatch(/Report interval/);
      // Millbrook is this operator's neighbourhood: keys are shown, not withheld.
      expect(text).toMatch(/Pre-shared key/);
      expect(text).not.toMatch(/withheld/);
      await screenshot(e2e.page, `planning-provisioning-${width}`);
    }
  });
});
