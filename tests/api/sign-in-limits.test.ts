import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { verifyPassword } from '../../server/auth/passwords';
import { seedDemo } from '../../server/db/seedDemo';
import { PEOPLE } from '../../server/db/demoScenario';
import { OutboxMessage, User } from '../../server/models';
import { PASSWORD, buildUser, call, signIn, useApi } from '../helpers/api';

const attempt = (app: Parameters<typeof request>[0], email: string, password: string, address: string) =>
  request(app).post('/api/v1/session').set('X-Forwarded-For', address).send({ email, password });

describe('sign-in limits a stranger cannot turn against the owner', () => {
  const ctx = useApi({ trustProxy: true, signInLimitPerAccountAddress: 3, signInLimitPerAccount: 6, signInLimitPerAddress: 10_000 });

  it('locks out only the address that guessed wrong, not the owner signing in from elsewhere', async () => {
    const owner = await buildUser();
    for (let i = 0; i < 3; i++) expect((await attempt(ctx.app, owner.email, 'not-the-password', '198.51.100.7')).status).toBe(401);
    const stranger = await attempt(ctx.app, owner.email, PASSWORD, '198.51.100.7');
    expect(stranger.status).toBe(429);
    expect(stranger.body.error.code).toBe('rate_limited');
    expect(Number(stranger.headers['retry-after'])).toBeGreaterThan(0);
    // The same account from the owner's own address is untouched.
    expect((await attempt(ctx.app, owner.email, PASSWORD, '203.0.113.20')).status).toBe(200);
  });

  it('slows an account guessed from many addresses, but not in a browser that signed in to it before', async () => {
    const owner = await buildUser();
    // The owner's browser signed in last week and signed out; it keeps the known-device cookie.
    const browser = request.agent(ctx.app);
    const first = await browser.post('/api/v1/session').set('X-Forwarded-For', '203.0.113.30').send({ email: owner.email, password: PASSWORD });
    expect(first.status).toBe(200);
    expect(String(first.headers['set-cookie'])).toMatch(
      /parapet\.known=\d+\.[A-Za-z0-9_-]{43}; Max-Age=\d+; Path=\/api\/v1\/session; Expires=[^;]+; HttpOnly; SameSite=Lax/,
    );
    await browser.delete('/api/v1/session').set('X-CSRF-Token', first.body.csrfToken);

    // Six strangers, two wrong guesses each: below the per-address limit, at the account's limit.
    for (let i = 0; i < 6; i++) expect((await attempt(ctx.app, owner.email, `wrong-guess-${i}`, `192.0.2.${10 + i}`)).status).toBe(401);
    expect((await attempt(ctx.app, owner.email, PASSWORD, '192.0.2.99')).status).toBe(429); // a fresh address, no cookie
    const known = await browser.post('/api/v1/session').set('X-Forwarded-For', '203.0.113.31').send({ email: owner.email, password: PASSWORD });
    expect(known.status).toBe(200);
    expect(known.body.user.id).toBe(owner.id);
  });

  it('does not let one account’s known-device cookie open the limit of another', async () => {
    const mine = await buildUser();
    const theirs = await buildUser();
    const browser = request.agent(ctx.app);
    expect((await browser.post('/api/v1/session').set('X-Forwarded-For', '203.0.113.40').send({ email: mine.email, password: PASSWORD })).status).toBe(200);
    for (let i = 0; i < 6; i++) await attempt(ctx.app, theirs.email, `wrong-guess-${i}`, `192.0.2.${30 + i}`);
    const res = await browser.post('/api/v1/session').set('X-Forwarded-For', '203.0.113.41').send({ email: theirs.email, password: PASSWORD });
    expect(res.status).toBe(429);
  });
});

describe('changing a password', () => {
  const ctx = useApi({ passwordChangeLimit: 3, demoMode: false, demoPassword: 'parapet-demo' });

  it('limits wrong current passwords per person (429), while other mistakes do not count', async () => {
    const agent = await signIn(ctx, await buildUser());
    for (let i = 0; i < 4; i++) {
      const weak = await call(agent, 'post', '/api/v1/me/password', { currentPassword: PASSWORD, newPassword: 'short' });
      expect(weak.status).toBe(400); // not a guess at the current password
    }
    for (let i = 0; i < 3; i++) {
      const res = await call(agent, 'post', '/api/v1/me/password', { currentPassword: `guess-${i}`, newPassword: 'quartz-lantern-meadow-91' });
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([{ path: 'currentPassword', message: 'currentPassword does not match your current password' }]);
    }
    const limited = await call(agent, 'post', '/api/v1/me/password', { currentPassword: PASSWORD, newPassword: 'quartz-lantern-meadow-91' });
    expect(limited.status).toBe(429);
    expect(limited.body.error.code).toBe('rate_limited');
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    // Another person is not affected.
    const other = await signIn(ctx, await buildUser());
    expect((await call(other, 'post', '/api/v1/me/password', { currentPassword: PASSWORD, newPassword: 'quartz-lantern-meadow-91' })).status).toBe(204);
  });

  it('refuses the published demo password outside the demo, in any case', async () => {
    const agent = await signIn(ctx, await buildUser());
    for (const newPassword of ['parapet-demo', 'PARAPET-DEMO']) {
      const res = await call(agent, 'post', '/api/v1/me/password', { currentPassword: PASSWORD, newPassword });
      expect(res.status).toBe(400);
      expect(res.body.error.details).toEqual([{ path: 'newPassword', message: 'newPassword is the published demo password; choose one of your own' }]);
    }
  });

  it('holds admin-created accounts to the same checks: not the demo password, not the person’s own name', async () => {
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    const person = { email: 'marigold.fenwick@lindenfall.example', name: 'Marigold Fenwick', role: 'host' };
    const demo = await call(admin, 'post', '/api/v1/users', { ...person, password: 'parapet-demo' });
    expect(demo.status).toBe(400);
    expect(demo.body.error.details).toEqual([{ path: 'password', message: 'password is the published demo password; choose one of your own' }]);
    const ownName = await call(admin, 'post', '/api/v1/users', { ...person, password: 'marigold-fenwick-2026' });
    expect(ownName.status).toBe(400);
    expect(ownName.body.error.details).toEqual([
      { path: 'password', message: 'password is mostly your own name or e-mail address; use words that have nothing to do with you' },
    ]);
    expect(await User.count({ where: { email: person.email } })).toBe(0);
    const ok = await call(admin, 'post', '/api/v1/users', { ...person, password: 'quartz-lantern-meadow-91' });
    expect(ok.status).toBe(201);
  });
});

describe('the demo', () => {
  const ctx = useApi({ demoMode: true, demoPassword: 'parapet-demo' });

  it('accepts the demo password where start.sh says this is the demo', async () => {
    const agent = await signIn(ctx, await buildUser());
    expect((await call(agent, 'post', '/api/v1/me/password', { currentPassword: PASSWORD, newPassword: 'parapet-demo' })).status).toBe(204);
  });

  it('gives every demo account a hash and salt of its own', async () => {
    await ctx.sequelize.query('TRUNCATE users RESTART IDENTITY CASCADE');
    expect(await seedDemo('parapet-demo')).toBe('loaded');
    const people = await User.findAll({ where: { email: PEOPLE.map((p) => p.email) } });
    expect(people).toHaveLength(PEOPLE.length);
    const hashes = people.map((p) => p.passwordHash!);
    const salts = hashes.map((h) => h.split('$')[4]);
    expect(new Set(hashes).size).toBe(PEOPLE.length);
    expect(new Set(salts).size).toBe(PEOPLE.length);
    for (const h of hashes) expect(await verifyPassword(h, 'parapet-demo')).toBe(true);
  });
});

describe('password-reset requests', () => {
  const ctx = useApi({ passwordResetMinMs: 300 });

  it('answer known and unknown addresses alike, after the same minimum time, and mail only the known one', async () => {
    const known = await buildUser();
    const timed = async (email: string) => {
      const started = performance.now();
      const res = await request(ctx.app).post('/api/v1/password-resets').send({ email });
      return { res, ms: performance.now() - started };
    };
    const a = await timed(known.email);
    const b = await timed('nobody-here@example.test');
    expect(a.res.status).toBe(202);
    expect(b.res.status).toBe(202);
    expect(b.res.body).toEqual(a.res.body);
    // Both waited at least the configured floor (PASSWORD_RESET_MIN_MS), the unknown one included.
    expect(a.ms).toBeGreaterThanOrEqual(295);
    expect(b.ms).toBeGreaterThanOrEqual(295);
    expect(await OutboxMessage.count({ where: { kind: 'password-reset' } })).toBe(1);
  });
});
