import { randomUUID } from 'node:crypto';
import pg from 'pg';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ServerProcess } from '../../server/tools/serverProcess';
import { mailTo, type FakeMail } from '../helpers/mailFake';
import { launchBrowser, screenshot, signInAs, startE2EServer } from './helpers/browser';

const PASSWORD = 'brackish-lantern-owl-meadow';

async function waitForMail(address: string, timeoutMs = 30_000): Promise<FakeMail> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const [mail] = await mailTo([address]);
    if (mail) return mail;
    if (Date.now() > until) throw new Error(`no mail reached ${address} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 300));
  }
}

describe('an invitation accepted end to end, through the mail fake', () => {
  let server: ServerProcess;
  let browser: Browser;
  let admin: Page;
  const email = `e2e-invitee-${randomUUID().slice(0, 8)}@example.test`;

  beforeAll(async () => {
    if (!process.env.MAILDEV_WEB_URL) throw new Error('MAILDEV_WEB_URL must point at the mail fake (and SMTP_PORT at its SMTP side).');
    [server, browser] = await Promise.all([
      // The outbox sender runs every half second, so the mail leaves quickly.
      startE2EServer({
        SMTP_HOST: '127.0.0.1',
        SMTP_PORT: process.env.SMTP_PORT ?? '1025',
        MAILDEV_WEB_URL: process.env.MAILDEV_WEB_URL,
        HEALTH_CHECK_INTERVAL_MS: '500',
      }),
      launchBrowser(),
    ]);
    admin = await (await browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage();
    await signInAs(admin, server.url, 'admin@parapet.example');
  });

  afterAll(async () => {
    // Leave the demo as it was: the invited person, their mail and their history go.
    const db = new pg.Client({ connectionString: process.env.E2E_DATABASE_URL });
    await db.connect();
    try {
      const { rows } = await db.query<{ id: number }>('SELECT id FROM users WHERE email = $1', [email]);
      for (const { id } of rows) {
        await db.query(`DELETE FROM outbox WHERE recipient_user_id = $1 OR recipient_address = $2`, [id, email]);
        await db.query(`DELETE FROM change_history WHERE table_name = 'users' AND record_id = $1::text`, [id]);
        await db.query(`DELETE FROM session WHERE (sess -> 'passport' ->> 'user') = $1::text`, [id]);
        await db.query(`DELETE FROM users WHERE id = $1`, [id]);
      }
    } finally {
      await db.end();
    }
    await browser?.close();
    await server?.stop();
  });

  it('admin invites, the mail arrives, the link sets a password, and the new person signs in', async () => {
    await admin.goto(`${server.url}/people`);
    await admin.getByRole('button', { name: 'Invite by e-mail' }).click();
    const form = admin.getByTestId('invite-form');
    await form.getByLabel('E-mail').fill(email);
    await form.getByLabel('Name').fill('Tamsin Brook');
    await form.getByLabel('Role').selectOption('host');
    await screenshot(admin, 'invitation-1-form');
    await form.getByRole('button', { name: 'Send invitation' }).click();
    await admin.getByText(`Invitation sent to ${email}.`).waitFor();
    await screenshot(admin, 'invitation-2-sent');

    const mail = await waitForMail(email);
    expect(mail.subject).toBe('You are invited to Parapet, the community network console');
    const link = /(http:\/\/\S+\/invite\/\S+)/.exec(mail.text)?.[1];
    expect(link?.startsWith(`${server.url}/invite/`)).toBe(true);

    const invitee = await (await browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage();
    await invitee.goto(link!);
    await invitee.getByRole('heading', { name: 'Welcome to Parapet' }).waitFor();
    // The page applies the same password rules as the server before sending.
    await invitee.getByLabel('New password').fill('password1234');
    await invitee.getByLabel('The same password again').fill('password1234');
    await invitee.getByRole('button', { name: 'Set my password' }).click();
    await invitee.getByText('is on the list of commonly used passwords; choose another').waitFor();
    await invitee.getByLabel('New password').fill(PASSWORD);
    await invitee.getByLabel('The same password again').fill(PASSWORD);
    await screenshot(invitee, 'invitation-3-choose-password');
    await invitee.getByRole('button', { name: 'Set my password' }).click();
    await invitee.getByTestId('invitation-accepted').waitFor();
    await screenshot(invitee, 'invitation-4-accepted');

    await invitee.getByRole('link', { name: 'Sign in', exact: true }).click();
    await invitee.getByLabel(/e-?mail/i).fill(email);
    await invitee.getByLabel(/password/i).fill(PASSWORD);
    await invitee.getByRole('button', { name: /sign in/i }).click();
    await invitee.getByTestId('user-menu').waitFor({ timeout: 15_000 });
    // A host lands on their own nodes.
    await invitee.waitForURL(/\/my-nodes$/);
    expect(await invitee.getByTestId('user-menu').innerText()).toContain('Tamsin Brook');
    await screenshot(invitee, 'invitation-5-signed-in');

    // The link is spent: using it again is refused in words.
    await invitee.getByRole('button', { name: /sign out/i }).click();
    await invitee.goto(link!);
    await invitee.getByLabel('New password').fill(PASSWORD);
    await invitee.getByLabel('The same password again').fill(PASSWORD);
    await invitee.getByRole('button', { name: 'Set my password' }).click();
    await invitee.getByText('This invitation was already used or replaced by a newer one. Ask an admin to invite you again.').waitFor();
  });
});
