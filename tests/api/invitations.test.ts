import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { User } from '../../server/models';
import { accountMails, tampered } from '../helpers/accountMail';
import { buildUser, call, signIn, unique, useApi } from '../helpers/api';
import { manualClock } from '../helpers/clock';

const STRONG = 'copper-kettle-moth-lantern';
const clock = manualClock('2026-06-01T12:00:00Z');
const invitee = (overrides: Record<string, unknown> = {}) => ({ email: `${unique('wren')}@example.test`, name: 'Wren Aldous', role: 'host', ...overrides });

describe('invitations API', () => {
  const ctx = useApi({ now: clock.now, invitationTtlMs: 72 * 3_600_000, accountMailLimitPerAddress: 3, accountMailLimitWindowMs: 3_600_000 });
  const signedIn = async (role: 'admin' | 'operator' | 'host') => signIn(ctx, await buildUser({ role, name: role === 'admin' ? 'Odile Farrant' : undefined }));

  describe('who may invite', () => {
    it('answers 401 to a signed-out caller', async () => {
      const res = await request(ctx.app).post('/api/v1/invitations').send(invitee());
      expect(res.status).toBe(401);
      expect(res.body.error).toEqual({ code: 'not_signed_in', message: 'Sign in to continue.' });
    });

    it.each(['operator of no neighbourhood', 'host'] as const)('answers 403 to a signed-in %s', async (who) => {
      const res = await call(await signedIn(who === 'host' ? 'host' : 'operator'), 'post', '/api/v1/invitations', invitee());
      expect(res.status).toBe(403);
      expect(res.body.error).toEqual({ code: 'forbidden', message: 'Only admins invite people, and operators invite hosts for their sites.' });
    });

    it.each([
      ['email', 'not-an-address', 'email must be an e-mail address'],
      ['role', 'owner', 'role must be one of admin, operator, host'],
      ['name', undefined, 'name is required'],
    ])('answers 400 when %s = %j', async (field, value, message) => {
      const res = await call(await signedIn('admin'), 'post', '/api/v1/invitations', invitee({ [field]: value }));
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([{ path: field, message }]);
    });
  });

  describe('an invitation, start to finish', () => {
    it('creates an inactive person, writes one invitation mail, and the link sets the password once', async () => {
      const body = invitee({ email: `${unique('Wren')}@Example.TEST` });
      const email = body.email.toLowerCase();
      const res = await call(await signedIn('admin'), 'post', '/api/v1/invitations', body);
      expect(res.status).toBe(201);
      expect(res.body.data).toMatchObject({ email, name: 'Wren Aldous', role: 'host', active: false, invited: true });
      expect(res.body.data.invitationExpiresAt).toBe('2026-06-04T12:00:00.000Z');

      const mails = await accountMails(ctx.sequelize, email, 'invitation');
      expect(mails).toHaveLength(1);
      expect(mails[0].subject).toBe('You are invited to Parapet, the community network console');
      expect(mails[0].text_body).toContain('Odile Farrant has invited you');
      expect(mails[0].text_body).toContain('as a host');

      // Not yet able to sign in.
      expect((await request(ctx.app).post('/api/v1/session').send({ email, password: STRONG })).status).toBe(401);

      const accepted = await request(ctx.app).post('/api/v1/invitations/accept').send({ token: mails[0].token, password: STRONG });
      expect(accepted.status).toBe(200);
      expect(accepted.body.data.email).toBe(email);
      const user = await User.findOne({ where: { email } });
      expect(user!.active).toBe(true);
      expect((await request(ctx.app).post('/api/v1/session').send({ email, password: STRONG })).status).toBe(200);

      const again = await request(ctx.app).post('/api/v1/invitations/accept').send({ token: mails[0].token, password: 'another-long-phrase-of-words' });
      expect(again.status).toBe(410);
      expect(again.body.error.code).toBe('link_used');
      expect(again.body.error.message).toBe('This invitation was already used or replaced by a newer one. Ask an admin to invite you again.');
    });

    it('refuses a tampered link with 400 and an expired one with 410, and neither sets a password', async () => {
      const body = invitee();
      await call(await signedIn('admin'), 'post', '/api/v1/invitations', body);
      const [mail] = await accountMails(ctx.sequelize, body.email, 'invitation');

      const bad = await request(ctx.app)
        .post('/api/v1/invitations/accept')
        .send({ token: tampered(mail.token), password: STRONG });
      expect(bad.status).toBe(400);
      expect(bad.body.error.code).toBe('bad_link');
      const garbage = await request(ctx.app).post('/api/v1/invitations/accept').send({ token: 'not-a-link', password: STRONG });
      expect(garbage.status).toBe(400);
      // A reset link is not an invitation, even when genuine in shape.
      const wrongPurpose = await request(ctx.app)
        .post('/api/v1/invitations/accept')
        .send({ token: mail.token.replace(/^invitation/, 'password-reset'), password: STRONG });
      expect(wrongPurpose.status).toBe(400);

      clock.advance(72 * 3600 + 1);
      try {
        const expired = await request(ctx.app).post('/api/v1/invitations/accept').send({ token: mail.token, password: STRONG });
        expect(expired.status).toBe(410);
        expect(expired.body.error).toEqual({ code: 'link_expired', message: 'This invitation has expired. Ask an admin to invite you again.' });
      } finally {
        clock.set('2026-06-01T12:00:00Z');
      }
      const user = await User.findOne({ where: { email: body.email } });
      expect(user!.passwordHash).toBeNull();
      expect(user!.active).toBe(false);
    });

    it('inviting the same address again replaces the first link', async () => {
      const body = invitee();
      const admin = await signedIn('admin');
      expect((await call(admin, 'post', '/api/v1/invitations', body)).status).toBe(201);
      expect((await call(admin, 'post', '/api/v1/invitations', { ...body, role: 'operator' })).status).toBe(201);
      const [first, second] = await accountMails(ctx.sequelize, body.email, 'invitation');
      const old = await request(ctx.app).post('/api/v1/invitations/accept').send({ token: first.token, password: STRONG });
      expect(old.status).toBe(410);
      expect(old.body.error.code).toBe('link_used');
      expect((await request(ctx.app).post('/api/v1/invitations/accept').send({ token: second.token, password: STRONG })).status).toBe(200);
      expect((await User.findOne({ where: { email: body.email } }))!.role).toBe('operator');
    });

    it('answers 409 for an address that already has an account', async () => {
      const existing = await buildUser();
      const res = await call(await signedIn('admin'), 'post', '/api/v1/invitations', invitee({ email: existing.email }));
      expect(res.status).toBe(409);
      expect(res.body.error).toEqual({ code: 'duplicate', message: 'Someone already has that e-mail address.' });
    });

    it('limits invitation mail per address (429 with Retry-After after the configured 3)', async () => {
      const admin = await signedIn('admin');
      const body = invitee();
      for (let i = 0; i < 3; i++) expect((await call(admin, 'post', '/api/v1/invitations', body)).status).toBe(201);
      const fourth = await call(admin, 'post', '/api/v1/invitations', body);
      expect(fourth.status).toBe(429);
      expect(Number(fourth.headers['retry-after'])).toBeGreaterThan(0);
      expect(await accountMails(ctx.sequelize, body.email, 'invitation')).toHaveLength(3);
      // Another address is not held back.
      expect((await call(admin, 'post', '/api/v1/invitations', invitee())).status).toBe(201);
    });
  });

  describe('password rules on accepting', () => {
    it.each([
      ['too-short-1', 'password must be at least 12 characters'],
      ['password1234', 'password is on the list of commonly used passwords; choose another'],
      ['aaaaaaaaaaaaaaaa', 'password is too easy to guess; use a longer phrase of unrelated words, not your name or e-mail'],
      ['wrenwrenaldous', 'password is too easy to guess; use a longer phrase of unrelated words, not your name or e-mail'],
    ])('refuses %j with 400 "%s" and leaves the link usable (the last only because it is made of the person’s own name)', async (password, message) => {
      const body = invitee();
      await call(await signedIn('admin'), 'post', '/api/v1/invitations', body);
      const [mail] = await accountMails(ctx.sequelize, body.email, 'invitation');
      const res = await request(ctx.app).post('/api/v1/invitations/accept').send({ token: mail.token, password });
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([{ path: 'password', message }]);
      expect((await request(ctx.app).post('/api/v1/invitations/accept').send({ token: mail.token, password: STRONG })).status).toBe(200);
    });
  });
});
