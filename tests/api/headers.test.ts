import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { buildUser, call, signIn, SIGNED_OUT, useApi } from '../helpers/api';
import { manualClock } from '../helpers/clock';

describe('security headers', () => {
  const ctx = useApi();

  it('marks signed-in and signed-out JSON answers no-store', async () => {
    const signedOut = await request(ctx.app).get('/api/v1/session');
    expect(signedOut.headers['cache-control']).toBe('no-store');
    const agent = await signIn(ctx, await buildUser({ role: 'admin' }));
    for (const url of ['/api/v1/session', '/api/v1/sites', '/api/v1/users', '/api/v1/me', '/api/v1/no-such-thing']) {
      const res = await call(agent, 'get', url);
      expect(res.headers['content-type'], url).toMatch(/^application\/json/);
      expect(res.headers['cache-control'], url).toBe('no-store');
    }
  });

  it('keeps a plain X-Request-Id and replaces anything else with a fresh UUID', async () => {
    const plain = await request(ctx.app).get('/api/health').set('X-Request-Id', 'proxy-7f3a.42:9');
    expect(plain.headers['x-request-id']).toBe('proxy-7f3a.42:9');
    const uuid = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;
    for (const given of ['<script>alert(1)</script>', 'a b', '"quoted"', 'x'.repeat(65), '-starts-with-dash', '%0d%0aforged']) {
      const res = await request(ctx.app).get('/api/health').set('X-Request-Id', given);
      expect(res.headers['x-request-id'], given).toMatch(uuid);
    }
    expect((await request(ctx.app).get('/api/health')).headers['x-request-id']).toMatch(uuid);
  });

  it('lets the page connect only to its own origin (CSP connect-src self, no bare ws: or wss:)', async () => {
    const res = await request(ctx.app).get('/api/health');
    const csp = res.headers['content-security-policy'] as string;
    const connect = csp
      .split(';')
      .map((d) => d.trim())
      .find((d) => d.startsWith('connect-src'));
    expect(connect).toBe("connect-src 'self'");
  });
});

describe('absolute session lifetime', () => {
  const clock = manualClock('2026-06-01T08:00:00Z');
  const ctx = useApi({ now: clock.now, sessionAbsoluteMs: 7 * 24 * 3_600_000 });

  it('ends a session seven days after sign-in however busy it is, and lets the person sign in again', async () => {
    clock.set('2026-06-01T08:00:00Z');
    const user = await buildUser({ role: 'operator' });
    const agent = await signIn(ctx, user);
    for (const day of [1, 2, 3, 4, 5, 6]) {
      clock.set(`2026-06-0${1 + day}T07:59:00Z`);
      const res = await call(agent, 'get', '/api/v1/me');
      expect(res.status, `day ${day}`).toBe(200);
    }
    clock.set('2026-06-08T08:00:00Z');
    const late = await call(agent, 'get', '/api/v1/me');
    expect(late.status).toBe(401);
    expect(late.body.error).toEqual(SIGNED_OUT);
    // The old session is gone for good, not only for that one request.
    expect((await call(agent, 'get', '/api/v1/session')).body.user).toBeNull();
    const again = await signIn(ctx, user);
    expect((await call(again, 'get', '/api/v1/me')).status).toBe(200);
  });

  it('reads the lifetime from config: SESSION_ABSOLUTE_HOURS, 7 days by default', async () => {
    const { loadConfig } = await import('../../server/config');
    expect(loadConfig({ DATABASE_URL: 'postgres://x@127.0.0.1/x' }).sessionAbsoluteMs).toBe(7 * 24 * 3_600_000);
    expect(loadConfig({ DATABASE_URL: 'postgres://x@127.0.0.1/x', SESSION_ABSOLUTE_HOURS: '12' }).sessionAbsoluteMs).toBe(12 * 3_600_000);
  });
});
