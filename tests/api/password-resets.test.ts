import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { accountMails, tampered } from '../helpers/accountMail';
import { buildUser, call, PASSWORD, signIn, unique, useApi } from '../helpers/api';
import { manualClock } from '../helpers/clock';

const NEW = 'saltmarsh-heron-violin-quay';
const clock = manualClock('2026-06-01T12:00:00Z');

describe('password resets API', () => {
  const ctx = useApi({ now: clock.now, passwordResetTtlMs: 60 * 60_000, accountMailLimitPerAddress: 2, accountMailLimitWindowMs: 3_600_000 });
  const ask = (email: string) => request(ctx.app).post('/api/v1/password-resets').send({ email });
  const complete = (token: string, password = NEW) => request(ctx.app).post('/api/v1/password-resets/complete').send({ token, password });

  it('answers 202 with the very same body for a known, an unknown and an inactive address; only the known one gets mail', async () => {
    const known = await buildUser();
    const inactive = await buildUser({ active: false });
    const stranger = `${unique('nobody')}@example.test`;
    const answers = [await ask(known.email.toUpperCase()), await ask(stranger), await ask(inactive.email)];
    for (const res of answers) {
      expect(res.status).toBe(202);
      expect(res.body).toEqual(answers[0].body);
    }
    expect(answers[0].body.data.message).toBe(
      'If that address belongs to an active Parapet account, a link to choose a new password is on its way. It works once, within 60 minutes.',
    );
    expect(await accountMails(ctx.sequelize, known.email, 'password-reset')).toHaveLength(1);
    expect(await accountMails(ctx.sequelize, stranger, 'password-reset')).toHaveLength(0);
    expect(await accountMails(ctx.sequelize, inactive.email, 'password-reset')).toHaveLength(0);
  });

  it('answers 400 to a request without a usable address', async () => {
    const res = await request(ctx.app).post('/api/v1/password-resets').send({ email: 'nope' });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([{ path: 'email', message: 'email must be an e-mail address' }]);
  });

  it('sets the new password once, signs out every earlier session, and refuses the link a second time', async () => {
    const user = await buildUser();
    const before = await signIn(ctx, user);
    await ask(user.email);
    const [mail] = await accountMails(ctx.sequelize, user.email, 'password-reset');
    expect(mail.subject).toBe('Choose a new Parapet password');

    const res = await complete(mail.token);
    expect(res.status).toBe(200);
    expect((await before.get('/api/v1/me')).status).toBe(401);
    expect((await request(ctx.app).post('/api/v1/session').send({ email: user.email, password: PASSWORD })).status).toBe(401);
    expect((await request(ctx.app).post('/api/v1/session').send({ email: user.email, password: NEW })).status).toBe(200);

    const reused = await complete(mail.token, 'yet-another-quiet-phrase');
    expect(reused.status).toBe(410);
    expect(reused.body.error).toEqual({
      code: 'link_used',
      message: 'This password-reset link was already used or replaced by a newer one. Ask for a new one from the sign-in page.',
    });
  });

  it('refuses a tampered link (400) and an expired one (410) and keeps the old password', async () => {
    const user = await buildUser();
    await ask(user.email);
    const [mail] = await accountMails(ctx.sequelize, user.email, 'password-reset');
    const bad = await complete(tampered(mail.token));
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('bad_link');
    // Changing the person the link is for breaks the signature too.
    const parts = mail.token.split('.');
    parts[2] = String(Number(parts[2]) + 1);
    expect((await complete(parts.join('.'))).status).toBe(400);

    clock.advance(3601);
    try {
      const expired = await complete(mail.token);
      expect(expired.status).toBe(410);
      expect(expired.body.error).toEqual({ code: 'link_expired', message: 'This password-reset link has expired. Ask for a new one from the sign-in page.' });
    } finally {
      clock.set('2026-06-01T12:00:00Z');
    }
    expect((await request(ctx.app).post('/api/v1/session').send({ email: user.email, password: PASSWORD })).status).toBe(200);
  });

  it('refuses a weak new password with 400 and leaves the link usable', async () => {
    const user = await buildUser();
    await ask(user.email);
    const [mail] = await accountMails(ctx.sequelize, user.email, 'password-reset');
    const weak = await complete(mail.token, 'qwertyuiop123');
    expect(weak.status).toBe(400);
    expect(weak.body.error.details).toEqual([{ path: 'password', message: 'password is on the list of commonly used passwords; choose another' }]);
    expect((await complete(mail.token)).status).toBe(200);
  });

  it('limits reset mail per address (the configured 2), whether or not the address exists', async () => {
    for (const email of [(await buildUser()).email, `${unique('ghost')}@example.test`]) {
      expect((await ask(email)).status).toBe(202);
      expect((await ask(email)).status).toBe(202);
      const third = await ask(email);
      expect(third.status).toBe(429);
      expect(third.body.error.code).toBe('rate_limited');
      expect(Number(third.headers['retry-after'])).toBeGreaterThan(0);
    }
  });

  it('a newer reset link replaces the older one', async () => {
    const user = await buildUser();
    await ask(user.email);
    await ask(user.email);
    const [first, second] = await accountMails(ctx.sequelize, user.email, 'password-reset');
    expect((await complete(first.token)).status).toBe(410);
    expect((await complete(second.token)).status).toBe(200);
  });

  it('needs no session and no CSRF token, even from a signed-in browser', async () => {
    const user = await buildUser();
    const agent = await signIn(ctx, user);
    const res = await call(agent, 'post', '/api/v1/password-resets', { email: user.email });
    expect(res.status).toBe(202);
  });
});
