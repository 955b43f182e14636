import { describe, expect, it } from 'vitest';
import { screenshot, signInAs, useE2E } from './helpers/browser';

describe('what each role sees in the browser', () => {
  const e2e = useE2E();

  it('sends a signed-out visitor to sign-in and refuses a wrong password with a message', async () => {
    await e2e.fresh();
    await e2e.page.goto(`${e2e.server.url}/sites`);
    await e2e.page.waitForURL(/\/sign-in/);
    await e2e.page.getByLabel(/e-?mail/i).fill('admin@parapet.example');
    await e2e.page.getByLabel(/password/i).fill('not-the-password');
    await e2e.page.getByRole('button', { name: /sign in/i }).click();
    await e2e.page.getByText('That e-mail and password do not match an active account.').waitFor();
    await screenshot(e2e.page, 'sign-in-refused');
  });

  it('shows an admin every neighbourhood, the people page and the counts by state', async () => {
    await e2e.fresh();
    await signInAs(e2e.page, e2e.server.url, 'admin@parapet.example');
    expect(await e2e.page.getByTestId('user-menu').innerText()).toMatch(/Marta Quillon/);
    await e2e.page.getByTestId('overview-counts').waitFor();
    expect(await e2e.page.getByTestId('overview-counts').innerText()).toMatch(/unknown|online/i);
    await screenshot(e2e.page, 'admin-overview');
    await e2e.page.goto(`${e2e.server.url}/neighbourhoods`);
    for (const name of ['Old Quay', 'Millbrook', 'Saltmarsh Row', 'Chapel Hill']) await e2e.page.getByText(name, { exact: true }).first().waitFor();
    await e2e.page.goto(`${e2e.server.url}/people`);
    await e2e.page.getByTestId('people-table').waitFor();
    expect(await e2e.page.getByTestId('people-table').innerText()).toContain('host@parapet.example');
    await screenshot(e2e.page, 'admin-people');
  });

  it('shows an operator only their neighbourhoods’ sites and no people page', async () => {
    await e2e.fresh();
    await signInAs(e2e.page, e2e.server.url, 'operator@parapet.example');
    expect(await e2e.page.getByTestId('nav').innerText()).not.toMatch(/People/);
    await e2e.page.goto(`${e2e.server.url}/sites?pageSize=100`);
    await e2e.page.getByTestId('sites-table').waitFor();
    await e2e.page.getByText('Granary Tower').first().waitFor();
    const text = await e2e.page.getByTestId('sites-table').innerText();
    expect(text).toContain('Mill Race Terrace'); // Millbrook, assigned
    expect(text).not.toContain('Reedbed Bungalow'); // Saltmarsh Row, not assigned
    expect(text).not.toContain('Belfry Lane 5'); // Chapel Hill, not assigned
    await screenshot(e2e.page, 'operator-sites');
  });

  it('shows a host only the sites they host, on a phone-sized screen', async () => {
    await e2e.fresh({ width: 375, height: 760 });
    await signInAs(e2e.page, e2e.server.url, 'host@parapet.example');
    await e2e.page.goto(`${e2e.server.url}/sites`);
    await e2e.page.getByText('Quay Chandlery').first().waitFor();
    const body = await e2e.page.locator('main').innerText();
    expect(body).toContain('Yew Tree House');
    expect(body).not.toContain('Granary Tower');
    expect(body).not.toContain('Mill Race Terrace');
    const overflow = await e2e.page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await screenshot(e2e.page, 'host-sites-phone');
  });
});
