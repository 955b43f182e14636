import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { api, ApiError, errorFrom, parseRetryAfter } from '../../../src/lib/api';
import { queryClient } from '../../../src/lib/query-client';
import { sessionKeys } from '../../../src/lib/query-keys';

const json = (status: number, body: unknown, headers: Record<string, string> = {}) =>
  new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json', ...headers } });

/** A stand-in XMLHttpRequest: records what was sent, answers with `answer`, and reports two progress steps. */
class FakeXhr {
  static last: FakeXhr | null = null;
  static answer = { status: 201, body: '{"data":{"name":"N47W039"}}', headers: {} as Record<string, string> };
  method = '';
  url = '';
  headers: Record<string, string> = {};
  withCredentials = false;
  status = 0;
  statusText = '';
  responseText = '';
  upload: { onprogress: ((e: { loaded: number; total: number; lengthComputable: boolean }) => void) | null } = { onprogress: null };
  onload: (() => void) | null = null;
  onerror: (() => void) | null = null;
  onabort: (() => void) | null = null;
  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }
  setRequestHeader(name: string, value: string) {
    this.headers[name] = value;
  }
  getResponseHeader(name: string) {
    return FakeXhr.answer.headers[name] ?? null;
  }
  send() {
    FakeXhr.last = this;
    this.upload.onprogress?.({ loaded: 50, total: 100, lengthComputable: true });
    this.upload.onprogress?.({ loaded: 100, total: 100, lengthComputable: true });
    this.status = FakeXhr.answer.status;
    this.responseText = FakeXhr.answer.body;
    this.onload?.();
  }
}

describe('the one API client', () => {
  beforeEach(() => {
    queryClient.setQueryData(sessionKeys.current(), { user: null, csrfToken: 'tok-1' });
  });
  afterEach(() => {
    vi.unstubAllGlobals();
    vi.useRealTimers();
    queryClient.clear();
  });

  it('sends JSON with the session CSRF token on a mutation, none on a read', async () => {
    const fetchMock = vi.fn(async () => json(200, { data: { id: 7 } }));
    vi.stubGlobal('fetch', fetchMock);
    await api.get('/sites', { page: 2, q: '' });
    await api.post('/sites', { name: 'Granary Tower' });
    const [getUrl, getInit] = fetchMock.mock.calls[0] as unknown as [string, RequestInit];
    const [postUrl, postInit] = fetchMock.mock.calls[1] as unknown as [string, RequestInit];
    expect(getUrl).toBe('/api/v1/sites?page=2');
    expect((getInit.headers as Record<string, string>)['X-CSRF-Token']).toBeUndefined();
    expect(postUrl).toBe('/api/v1/sites');
    expect((postInit.headers as Record<string, string>)['X-CSRF-Token']).toBe('tok-1');
    expect(postInit.body).toBe('{"name":"Granary Tower"}');
  });

  it('turns the error envelope into an ApiError with its code and details', async () => {
    const details = [{ path: 'name', message: 'is required' }];
    vi.stubGlobal('fetch', async () => json(400, { error: { code: 'validation_failed', message: 'Check the fields.', details } }));
    const error = await api.patch('/sites/1', {}).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({ status: 400, code: 'validation_failed', message: 'Check the fields.', details });
  });

  it('gives every 429 the wait from Retry-After (RFC 9110 §10.2.3, delay-seconds)', async () => {
    vi.stubGlobal('fetch', async () => json(429, { error: { code: 'rate_limited', message: 'Too many failed sign-ins.' } }, { 'Retry-After': '120' }));
    const error = (await api.post('/session', {}).catch((e: unknown) => e)) as ApiError;
    expect(error.code).toBe('rate_limited');
    expect(error.retryAfterS).toBe(120);
    expect(error.message).toBe('Too many failed sign-ins. (try again in 2 min)');
  });

  it('reads Retry-After as seconds or an HTTP date (RFC 9110 §10.2.3), and nothing else', () => {
    const now = Date.parse('2026-03-01T10:00:00Z');
    expect(parseRetryAfter('30', now)).toBe(30);
    expect(parseRetryAfter('Sun, 01 Mar 2026 10:01:00 GMT', now)).toBe(60);
    expect(parseRetryAfter('soon', now)).toBeNull();
    expect(parseRetryAfter(null, now)).toBeNull();
  });

  it('a 429 from an upload goes through the same handler', () => {
    const error = errorFrom(429, 'Too Many Requests', '5', null);
    expect(error).toMatchObject({ status: 429, code: 'rate_limited', retryAfterS: 5 });
    expect(error.message).toBe('Too many attempts. Wait a little and try again. (try again in 5 s)');
  });

  it('a 503 database_unavailable raises the banner, which probes /api/health until it answers', async () => {
    vi.useFakeTimers();
    const down = { error: { code: 'database_unavailable', message: 'No database.' } };
    const fetchMock = vi.fn(async (url: string) => (url === '/api/health' ? json(200, { ok: true }) : json(503, down)));
    vi.stubGlobal('fetch', fetchMock);
    const error = (await api.get('/nodes').catch((e: unknown) => e)) as ApiError;
    expect(error.code).toBe('database_unavailable');
    await vi.advanceTimersByTimeAsync(3_000);
    expect(fetchMock.mock.calls.map((c) => c[0])).toContain('/api/health');
  });

  it('an unreachable server is a network_error with a message a person can act on', async () => {
    vi.stubGlobal('fetch', async () => {
      throw new TypeError('Failed to fetch');
    });
    await expect(api.get('/nodes')).rejects.toMatchObject({ status: 0, code: 'network_error', message: expect.stringMatching(/Check your connection/) });
  });

  it('uploads multipart with the CSRF token and reports progress', async () => {
    vi.stubGlobal('XMLHttpRequest', FakeXhr);
    FakeXhr.answer = { status: 201, body: '{"data":{"name":"N47W039"}}', headers: {} };
    const seen: number[] = [];
    const form = new FormData();
    const body = await api.upload<{ data: { name: string } }>('/terrain/tiles', form, (p) => seen.push(p.loaded));
    expect(body.data.name).toBe('N47W039');
    expect(FakeXhr.last).toMatchObject({ method: 'POST', url: '/api/v1/terrain/tiles', withCredentials: true });
    expect(FakeXhr.last?.headers['X-CSRF-Token']).toBe('tok-1');
    expect(seen).toEqual([50, 100]);
  });

  it('an upload refused with 413 keeps the server message', async () => {
    vi.stubGlobal('XMLHttpRequest', FakeXhr);
    FakeXhr.answer = { status: 413, body: '{"error":{"code":"too_large","message":"The file is over 30 MB."}}', headers: {} };
    await expect(api.upload('/sites/1/photos', new FormData())).rejects.toMatchObject({ status: 413, code: 'too_large', message: 'The file is over 30 MB.' });
  });
});
