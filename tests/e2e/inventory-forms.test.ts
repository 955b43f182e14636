import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Page } from 'playwright-core';
import sharp from 'sharp';
import { afterAll, describe, expect, it } from 'vitest';
import { validChannels } from '../../shared/radio/channels';
import { screenshot, signInAs, useE2E } from './helpers/browser';

interface NodeRow {
  id: number;
  name: string;
  siteId: number;
}
interface RadioRow {
  id: number;
  nodeId: number;
  iface: string;
  band: string;
  channel: number;
  channelWidthMHz: number;
  txPowerDbm: number;
  antennaGainDbi: number;
  polarisation: string;
  cableLossDb: number;
  role: string;
  ssid: string | null;
  encryption: string;
  hasPreSharedKey: boolean;
  groupRekeyS: number;
}
interface LinkRow {
  id: number;
  name: string | null;
  radioAId: number;
  radioBId: number;
  status: string;
}

/**
 * The API as the signed-in page sees it (its cookies, the CSRF token for writes), called with the page's own fetch:
 * the browser retries an idempotent request whose kept-alive connection the server had just closed.
 */
async function api(page: Page, base: string, method: 'GET' | 'POST' | 'PATCH' | 'DELETE', path: string, data?: unknown) {
  return page.evaluate(
    async ({ url, method, data, sessionUrl }) => {
      const headers: Record<string, string> = { Accept: 'application/json' };
      if (method !== 'GET') headers['X-CSRF-Token'] = (await (await fetch(sessionUrl)).json()).csrfToken;
      if (data !== undefined) headers['Content-Type'] = 'application/json';
      const res = await fetch(url, { method, headers, body: data === undefined ? undefined : JSON.stringify(data) });
      return { status: res.status, body: res.status === 204 ? null : await res.json() };
    },
    { url: `${base}/api/v1${path}`, method, data, sessionUrl: `${base}/api/v1/session` },
  );
}

async function nodeNamed(page: Page, base: string, name: string): Promise<NodeRow> {
  const { body } = await api(page, base, 'GET', `/nodes?q=${encodeURIComponent(name)}&pageSize=50`);
  const node = (body.data as NodeRow[]).find((n) => n.name === name);
  if (!node) throw new Error(`demo node ${name} is missing`);
  return node;
}

const radiosOf = async (page: Page, base: string, nodeId: number) =>
  (await api(page, base, 'GET', `/radios?nodeId=${nodeId}&pageSize=500`)).body.data as RadioRow[];

/** The option values of a select, without its "Choose…" placeholder. */
const optionValues = (page: Page, label: string) =>
  page
    .getByLabel(label, { exact: true })
    .locator('option')
    .evaluateAll((os) => os.map((o) => (o as HTMLOptionElement).value).filter((v) => v !== ''));

/** The error text shown under a field (form-field.tsx puts it in the element named by aria-describedby). */
async function fieldError(page: Page, label: string) {
  const field = page.getByLabel(label, { exact: true });
  await expect.poll(() => field.getAttribute('aria-invalid'), { timeout: 10_000 }).toBe('true');
  const id = await field.getAttribute('id');
  return (await page.locator(`[id="${id}-error"]`).innerText()).trim();
}

// Photos are stored under a dot-directory, as start.sh's install does (.data/uploads).
const scratch = fs.mkdtempSync(path.join(os.tmpdir(), 'parapet-e2e-photos-'));
const dataDir = path.join(scratch, '.data', 'uploads');

describe('the inventory in the browser: radios, links and install photos', () => {
  const e2e = useE2E({ DATA_DIR: dataDir });
  const base = () => e2e.server.url;
  afterAll(() => fs.rmSync(scratch, { recursive: true, force: true }));

  it('adds, edits and removes a radio on a node page, offering only the region’s channels and the API’s messages', async () => {
    const page = await e2e.fresh();
    page.on('dialog', (d) => void d.accept());
    await signInAs(page, base(), 'operator@parapet.example');
    const node = await nodeNamed(page, base(), 'lf-cooper');
    await page.goto(`${base()}/nodes/${node.id}`);
    await page.getByRole('button', { name: 'Add a radio' }).click();
    const form = page.getByTestId('radio-form');
    await form.waitFor();
    expect(await form.getByRole('note').innerText()).toMatch(/High-gain antennas.*regulator/s);

    // The demo network is in the EU: 5 GHz at 20 MHz offers ETSI's channels only (no 144, no 149–165).
    await page.getByLabel('Band', { exact: true }).selectOption('5');
    await page.getByLabel('Channel width', { exact: true }).selectOption('20');
    const eu20 = (await optionValues(page, 'Channel')).map(Number);
    expect(eu20).toEqual(validChannels('5', 20, 'EU'));
    expect(eu20).not.toContain(149);
    expect(eu20).not.toContain(144);
    // 40 MHz: only primaries whose whole bonded pair is allowed (IEEE 802.11 fixed bonding 36+40 … 132+136; 140 has no partner in the EU).
    await page.getByLabel('Channel width', { exact: true }).selectOption('40');
    const eu40 = (await optionValues(page, 'Channel')).map(Number);
    expect(eu40).toEqual(validChannels('5', 40, 'EU'));
    expect(eu40).toContain(44);
    expect(eu40).not.toContain(140);
    // 2.4 GHz has no 80 MHz channel, so the width is not offered.
    await page.getByLabel('Band', { exact: true }).selectOption('2.4');
    expect(await optionValues(page, 'Channel width')).toEqual(['20', '40']);
    expect((await optionValues(page, 'Channel')).map(Number)).toEqual(validChannels('2.4', 40, 'EU'));
    await page.getByLabel('Band', { exact: true }).selectOption('5');
    await page.getByLabel('Channel width', { exact: true }).selectOption('40');

    // Out of range: the form shows the API's own message for the same value.
    await page.getByLabel('Interface', { exact: true }).fill('wlan3');
    await page.getByLabel('Role', { exact: true }).selectOption('mesh');
    await page.getByLabel('Channel', { exact: true }).selectOption('44');
    await page.getByLabel('Transmit power (dBm)').fill('50');
    await page.getByLabel('Antenna gain (dBi)').fill('12');
    await page.getByLabel('Polarisation').selectOption('horizontal');
    await page.getByLabel('Cable and connector loss (dB)').fill('1.5');
    await page.getByLabel('SSID').fill('lf-mesh-cooper');
    await page.getByLabel('Encryption').selectOption('wpa3-sae');
    await page.getByLabel('Pre-shared key').fill('short');
    await page.getByLabel('Group key rekey interval (s)').fill('900');
    await page.getByRole('button', { name: 'Add radio' }).click();
    const powerMessage = await fieldError(page, 'Transmit power (dBm)');
    // The first field the schema refused takes focus, so a keyboard user lands on it.
    await expect.poll(() => page.getByLabel('Transmit power (dBm)').evaluate((el) => el === document.activeElement), { timeout: 10_000 }).toBe(true);
    const keyMessage = await fieldError(page, 'Pre-shared key');
    const refused = await api(page, base(), 'POST', '/radios', {
      nodeId: node.id,
      iface: 'wlan3',
      role: 'mesh',
      band: '5',
      channel: 44,
      channelWidthMHz: 40,
      txPowerDbm: 50,
      antennaGainDbi: 12,
      polarisation: 'horizontal',
      cableLossDb: 1.5,
      ssid: 'lf-mesh-cooper',
      encryption: 'wpa3-sae',
      preSharedKey: 'short',
      groupRekeyS: 900,
    });
    expect(refused.status).toBe(400);
    const apiMessage = (path: string) => (refused.body.error.details as { path: string; message: string }[]).find((d) => d.path === path)?.message;
    // The API names the field in front of the schema's message; the form shows the same message under the field.
    expect(powerMessage).toBe('must be at most 36 dBm');
    expect(apiMessage('txPowerDbm')).toBe(`txPowerDbm ${powerMessage}`);
    expect(keyMessage).toMatch(/8–63 printable characters or 64 hex digits/);
    expect(apiMessage('preSharedKey')).toBe(`preSharedKey ${keyMessage}`);
    await screenshot(page, 'radio-form-invalid-1280');

    await page.getByLabel('Transmit power (dBm)').fill('20');
    await page.getByLabel('Pre-shared key').fill('cooperage-mesh-2026');
    const created = page.waitForResponse((r) => r.url().endsWith('/api/v1/radios') && r.request().method() === 'POST');
    await page.getByRole('button', { name: 'Add radio' }).click();
    expect((await created).status()).toBe(201);
    await form.waitFor({ state: 'detached' });
    await page.getByTestId('radios-table').getByText('wlan3').waitFor();
    const stored = (await radiosOf(page, base(), node.id)).find((r) => r.iface === 'wlan3')!;
    expect(stored).toMatchObject({
      role: 'mesh',
      band: '5',
      channel: 44,
      channelWidthMHz: 40,
      txPowerDbm: 20,
      antennaGainDbi: 12,
      polarisation: 'horizontal',
      cableLossDb: 1.5,
      ssid: 'lf-mesh-cooper',
      encryption: 'wpa3-sae',
      hasPreSharedKey: true,
      groupRekeyS: 900,
    });
    expect(JSON.stringify(stored)).not.toContain('cooperage-mesh-2026');

    // Edit: the key is never shown back; a blank key keeps it.
    await page.getByRole('button', { name: 'Edit radio wlan3' }).click();
    await form.waitFor();
    expect(await page.getByLabel('Pre-shared key').inputValue()).toBe('');
    expect(await page.content()).not.toContain('cooperage-mesh-2026');
    await page.getByLabel('Transmit power (dBm)').fill('15');
    await page.getByLabel('Channel width', { exact: true }).selectOption('20');
    expect(await page.getByLabel('Channel', { exact: true }).inputValue()).toBe('44');
    const patched = page.waitForResponse((r) => r.url().endsWith(`/api/v1/radios/${stored.id}`) && r.request().method() === 'PATCH');
    await page.getByRole('button', { name: 'Save radio' }).click();
    expect((await patched).status()).toBe(200);
    await form.waitFor({ state: 'detached' });
    await page.getByTestId('radios-table').getByText('15 dBm').waitFor();
    expect((await api(page, base(), 'GET', `/radios/${stored.id}`)).body.data).toMatchObject({
      txPowerDbm: 15,
      channelWidthMHz: 20,
      channel: 44,
      hasPreSharedKey: true,
    });
    await screenshot(page, 'radio-edited-1280');

    await page.getByRole('button', { name: 'Remove radio wlan3' }).click();
    await page.getByTestId('radios-table').getByText('wlan3').waitFor({ state: 'detached' });
    expect((await api(page, base(), 'GET', `/radios/${stored.id}`)).status).toBe(404);
  }, 180_000);

  it('adds a link from one node’s page, edits it from the far node’s page, and adds and removes links on the map', async () => {
    const page = await e2e.fresh();
    page.on('dialog', (d) => void d.accept());
    await signInAs(page, base(), 'operator@parapet.example');
    const cooper = await nodeNamed(page, base(), 'lf-cooper');
    const rope = await nodeNamed(page, base(), 'lf-rope');
    const cooperAp = (await radiosOf(page, base(), cooper.id)).find((r) => r.iface === 'wlan1')!;
    const cooperBackhaul = (await radiosOf(page, base(), cooper.id)).find((r) => r.iface === 'wlan0')!;
    const ropeAp = (await radiosOf(page, base(), rope.id)).find((r) => r.iface === 'wlan1')!;

    await page.goto(`${base()}/nodes/${cooper.id}`);
    await page.getByRole('button', { name: 'Add a link' }).click();
    const form = page.getByTestId('link-form');
    await form.waitFor();
    // Nothing picked at the far end: the schema names the field.
    await page.getByLabel("This node's radio").selectOption(String(cooperAp.id));
    await page.getByRole('button', { name: 'Add link' }).click();
    expect(await fieldError(page, 'Far end: radio')).toBe('is required');

    // An existing pair (the demo's backhaul to Quay Chandlery): the API's 409 message is shown as it is.
    const quay = await nodeNamed(page, base(), 'lf-quay');
    const quayDown = (await radiosOf(page, base(), quay.id)).find((r) => r.iface === 'wlan2')!;
    await page.getByLabel("This node's radio").selectOption(String(cooperBackhaul.id));
    await page.getByLabel('Far end: site').selectOption({ label: 'Quay Chandlery' });
    await page.getByLabel('Far end: node').selectOption(String(quay.id));
    await page.getByLabel('Far end: radio').selectOption(String(quayDown.id));
    const duplicate = page.waitForResponse((r) => r.url().endsWith('/api/v1/links') && r.request().method() === 'POST');
    await page.getByRole('button', { name: 'Add link' }).click();
    const dup = await duplicate;
    expect(dup.status()).toBe(409);
    const dupMessage = (await dup.json()).error.message as string;
    expect(dupMessage).toMatch(/already linked/);
    await form.getByText(dupMessage).waitFor();

    // The real one: Cooperage Yard's access point to Ropewalk 14's, picked by site then node.
    await page.getByLabel("This node's radio").selectOption(String(cooperAp.id));
    await page.getByLabel('Far end: site').selectOption({ label: 'Ropewalk 14' });
    await page.getByLabel('Far end: node').selectOption(String(rope.id));
    await page.getByLabel('Far end: radio').selectOption(String(ropeAp.id));
    await page.getByLabel('Name (optional)').fill('Cooperage – Ropewalk trial');
    const created = page.waitForResponse((r) => r.url().endsWith('/api/v1/links') && r.request().method() === 'POST');
    await page.getByRole('button', { name: 'Add link' }).click();
    const response = await created;
    expect(response.status()).toBe(201);
    const link = (await response.json()).data as LinkRow;
    expect(link).toMatchObject({ radioAId: cooperAp.id, radioBId: ropeAp.id, status: 'planned', name: 'Cooperage – Ropewalk trial' });
    await page.getByTestId('links-table').getByText('Cooperage – Ropewalk trial').waitFor();
    await screenshot(page, 'link-added-1280');

    // From the far node's page: the same link, edited to live.
    await page.getByTestId('links-table').getByRole('link', { name: 'lf-rope' }).click();
    await page.waitForURL(new RegExp(`/nodes/${rope.id}$`));
    await page.getByRole('button', { name: 'Edit Cooperage – Ropewalk trial' }).click();
    await form.waitFor();
    await page.getByLabel('Status').selectOption('live');
    await page.getByLabel('Name (optional)').fill('Cooperage – Ropewalk');
    const patched = page.waitForResponse((r) => r.url().endsWith(`/api/v1/links/${link.id}`) && r.request().method() === 'PATCH');
    await page.getByRole('button', { name: 'Save link' }).click();
    expect((await patched).status()).toBe(200);
    await form.waitFor({ state: 'detached' });
    const row = page.getByTestId('links-table').locator('tr', { hasText: 'Cooperage – Ropewalk' });
    await expect.poll(() => row.innerText(), { timeout: 10_000 }).toMatch(/Live/);
    expect((await api(page, base(), 'GET', `/links/${link.id}`)).body.data).toMatchObject({ status: 'live', name: 'Cooperage – Ropewalk' });

    // On the map: the selected node's panel edits and removes the link, and adds another picked by site and node.
    await page.getByRole('link', { name: 'Show on the map' }).click();
    await page.waitForURL(/\/topology\?node=/);
    const panelLinks = page.getByTestId('node-links');
    await panelLinks.waitFor();
    await page.getByRole('button', { name: 'Remove Cooperage – Ropewalk' }).click();
    await expect.poll(async () => (await api(page, base(), 'GET', `/links/${link.id}`)).status, { timeout: 10_000 }).toBe(404);
    await page.getByRole('button', { name: 'Edit Cooperage – Ropewalk' }).waitFor({ state: 'detached' });

    await page.getByRole('button', { name: 'Add a link' }).click();
    await form.waitFor();
    await page.getByLabel("This node's radio").selectOption(String(ropeAp.id));
    await page.getByLabel('Far end: site').selectOption({ label: 'Cooperage Yard' });
    await page.getByLabel('Far end: node').selectOption(String(cooper.id));
    await page.getByLabel('Far end: radio').selectOption(String(cooperAp.id));
    await page.getByLabel('Name (optional)').fill('Ropewalk – Cooperage from the map');
    const fromMap = page.waitForResponse((r) => r.url().endsWith('/api/v1/links') && r.request().method() === 'POST');
    await page.getByRole('button', { name: 'Add link' }).click();
    const mapResponse = await fromMap;
    expect(mapResponse.status()).toBe(201);
    const mapLink = (await mapResponse.json()).data as LinkRow;
    await page.getByTestId(`topology-link-${mapLink.id}`).waitFor({ state: 'attached', timeout: 15_000 });
    await screenshot(page, 'link-added-on-map-1280');
    await page.getByRole('button', { name: 'Remove Ropewalk – Cooperage from the map' }).click();
    await page.getByTestId(`topology-link-${mapLink.id}`).waitFor({ state: 'detached', timeout: 15_000 });
    expect((await api(page, base(), 'GET', `/links/${mapLink.id}`)).status).toBe(404);
  }, 180_000);

  it('shows the radio and link forms at phone width', async () => {
    const page = await e2e.fresh({ width: 375, height: 800 });
    await signInAs(page, base(), 'operator@parapet.example');
    const node = await nodeNamed(page, base(), 'lf-cooper');
    await page.goto(`${base()}/nodes/${node.id}`);
    await page.getByRole('button', { name: 'Add a radio' }).click();
    await page.getByTestId('radio-form').waitFor();
    await page.getByRole('button', { name: 'Add a link' }).click();
    await page.getByTestId('link-form').waitFor();
    // Nothing runs off the side of a phone screen.
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375);
    await screenshot(page, 'inventory-forms-375');
  });

  it('offers no radio or link editing to a host', async () => {
    const page = await e2e.fresh();
    await signInAs(page, base(), 'host@parapet.example');
    const { body } = await api(page, base(), 'GET', '/nodes?pageSize=5');
    const node = (body.data as NodeRow[])[0];
    await page.goto(`${base()}/nodes/${node.id}`);
    await page.getByRole('heading', { name: 'Radios' }).waitFor();
    await page.getByRole('heading', { name: 'Links' }).waitFor();
    expect(await page.getByRole('button', { name: 'Add a radio' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Add a link' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /^Edit radio/ }).count()).toBe(0);
  });

  it('shows a stored channel the region does not allow as it is, marked, instead of changing it', async () => {
    const page = await e2e.fresh();
    await signInAs(page, base(), 'admin@parapet.example');
    // The demo's Saltmarsh relay sends on 5 GHz channel 149 at 40 MHz: allowed in the US, not in the EU (ETSI EN 301 893).
    const marsh = await nodeNamed(page, base(), 'lf-marsh');
    await page.goto(`${base()}/nodes/${marsh.id}`);
    await page.getByRole('button', { name: 'Edit radio wlan2' }).click();
    await page.getByTestId('radio-form').waitFor();
    const channel = page.getByLabel('Channel', { exact: true });
    expect(await channel.inputValue()).toBe('149');
    expect(await channel.locator('option:checked').innerText()).toMatch(/149 · not usable at 40 MHz in EU/);
    await page.getByRole('button', { name: 'Cancel' }).click();
    await page.getByTestId('radio-form').waitFor({ state: 'detached' });
  });

  it('uploads an install photo on a site page, shows it, serves it without its EXIF, and removes it', async () => {
    const page = await e2e.fresh();
    page.on('dialog', (d) => void d.accept());
    await signInAs(page, base(), 'operator@parapet.example');
    const { body } = await api(page, base(), 'GET', '/sites?q=Cooperage');
    const site = (body.data as { id: number; name: string }[])[0];
    await page.goto(`${base()}/sites/${site.id}`);
    const phoneJpeg = await sharp({ create: { width: 64, height: 32, channels: 3, background: '#0a7' } })
      .jpeg()
      .withMetadata({ orientation: 6 })
      .withExifMerge({ IFD0: { Artist: 'Odile Brenner' }, IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '52/1 4/1 12/1' } })
      .toBuffer();
    const uploaded = page.waitForResponse((r) => r.url().endsWith(`/api/v1/sites/${site.id}/photos`) && r.request().method() === 'POST');
    await page.getByTestId('photo-file').setInputFiles({ name: 'IMG_2041.jpg', mimeType: 'image/jpeg', buffer: phoneJpeg });
    expect((await uploaded).status()).toBe(201);
    const img = page.getByTestId('site-photos').locator('img').first();
    await img.waitFor();
    // The thumbnail really loads from the store under .data/: a decoded picture, upright (taller than wide).
    await expect
      .poll(() => img.evaluate((el) => (el as HTMLImageElement).complete && (el as HTMLImageElement).naturalWidth), { timeout: 15_000 })
      .toBeGreaterThan(0);
    const [w, h] = await img.evaluate((el) => [(el as HTMLImageElement).naturalWidth, (el as HTMLImageElement).naturalHeight]);
    expect(h).toBeGreaterThan(w);
    const href = await page.getByTestId('site-photos').locator('a').first().getAttribute('href');
    const full = await page.request.get(`${base()}${href}`);
    expect(full.status()).toBe(200);
    expect(full.headers()['content-type']).toBe('image/jpeg');
    const meta = await sharp(await full.body()).metadata();
    expect(meta).toMatchObject({ width: 32, height: 64 });
    expect(meta.exif).toBeUndefined();
    expect((await full.body()).toString('latin1')).not.toContain('Odile Brenner');
    await screenshot(page, 'site-photo-1280');

    await page.getByTestId('site-photos').getByRole('button', { name: 'Remove' }).first().click();
    await page.getByTestId('site-photos').waitFor({ state: 'detached' });
    expect((await page.request.get(`${base()}${href}`)).status()).toBe(404);
  });
});
