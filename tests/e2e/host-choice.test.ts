import { describe, expect, it } from 'vitest';
import { screenshot, signInAs, useE2E } from './helpers/browser';

describe('choosing a site’s host in the browser', () => {
  const e2e = useE2E();

  it('offers an operator only themself and people already hosting in their neighbourhoods, and an e-mail invitation for anyone else', async () => {
    await e2e.fresh();
    await signInAs(e2e.page, e2e.server.url, 'operator@parapet.example');
    await e2e.page.goto(`${e2e.server.url}/sites?q=Mill%20Race`);
    await e2e.page.getByRole('link', { name: 'Mill Race Terrace' }).click();
    await e2e.page.getByRole('button', { name: 'Edit site' }).click();
    const host = e2e.page.getByLabel('Host');
    // The candidates arrive from the server; wait until the picker lists someone other than the site's host.
    await e2e.page.waitForFunction(
      () => {
        const select = [...document.querySelectorAll('select')].find((s) => s.labels?.[0]?.textContent?.includes('Host'));
        return !!select && [...select.options].some((o) => o.text === 'Tobias Fenwright');
      },
      undefined,
      { timeout: 20_000 },
    );
    const options = await host.locator('option').allInnerTexts();
    expect(options).toContain('Sami Ferrow'); // hosts Mill Race Terrace (Millbrook)
    expect(options).toContain('Tobias Fenwright'); // the operator themself
    expect(options).toContain('Marta Quillon'); // the admin hosts Granary Tower in Old Quay, so she is linked
    expect(options).not.toContain('Ada Pennock'); // another neighbourhood's operator
    expect(options).not.toContain('Jun Aldersey'); // hosts in Saltmarsh Row, not this operator's
    expect(await host.inputValue()).not.toBe(''); // the current host stays chosen
    await screenshot(e2e.page, 'operator-host-picker');
    await e2e.page.getByRole('button', { name: 'Cancel' }).first().click();

    await e2e.page.getByRole('button', { name: 'Invite a new host by e-mail' }).click();
    const form = e2e.page.getByTestId('invite-host-form');
    await form.getByLabel("Host's e-mail").fill('not-an-address');
    await form.getByLabel("Host's name").fill('Wren\u202EAmberly');
    await form.getByRole('button', { name: 'Send invitation' }).click();
    // The shared schema answers in the browser, before anything is sent.
    await form.getByText(/must be an e-mail address/).waitFor({ timeout: 10_000 });
    await form.getByText(/must not contain text-direction control characters/).waitFor({ timeout: 10_000 });
    await screenshot(e2e.page, 'operator-invite-host-refused');
  });
});
