/** The session cookie (name=value) from a sign-in answer; it may carry other cookies beside it. */
export const sessionCookieOf = (res: Response) =>
  res.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .find((c) => c.startsWith('parapet.sid=')) ?? '';

/** A small signed-in HTTP client for the scripts (simulator, benchmarks): cookie + CSRF, JSON in and out. */
export class ApiClient {
  private cookie = '';
  private csrf = '';
  constructor(readonly baseUrl: string) {}

  async signIn(email: string, password: string) {
    const res = await fetch(`${this.baseUrl}/api/v1/session`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email, password }),
    });
    if (res.status !== 200) throw new Error(`sign-in as ${email} failed with ${res.status}: ${await res.text()}`);
    this.cookie = sessionCookieOf(res);
    this.csrf = (await res.json()).csrfToken;
  }

  async call<T = unknown>(method: string, path: string, body?: unknown): Promise<T> {
    const res = await fetch(`${this.baseUrl}${path}`, {
      method,
      headers: { cookie: this.cookie, 'x-csrf-token': this.csrf, ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    if (!res.ok) throw new Error(`${method} ${path} → ${res.status}: ${await res.text()}`);
    return (res.status === 204 ? undefined : await res.json()) as T;
  }
}
