import { io as connect, type Socket } from 'socket.io-client';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PASSWORD, buildUser, useApi } from '../helpers/api';
import { buildNeighbourhood, buildNode } from '../helpers/factories';
import { sessionCookieOf } from '../../server/tools/apiClient';
import { startServerProcess, type ServerProcess } from '../../server/tools/serverProcess';

/*
 * Live updates follow access as it changes: two server processes share one database and the
 * PostgreSQL adapter; the change is made on one, the person's socket lives on the other.
 */

interface Session {
  cookie: string;
  csrf: string;
}
interface Event {
  name: string;
  body: { nodeId?: number; neighbourhoodIds?: number[] };
}
interface Listener {
  socket: Socket;
  events: Event[];
  disconnected: () => string | null;
}

async function signInAt(url: string, email: string): Promise<Session> {
  const res = await fetch(`${url}/api/v1/session`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status}`);
  return { cookie: sessionCookieOf(res), csrf: (await res.json()).csrfToken };
}

function listen(url: string, cookie: string, origin?: string): Promise<Listener> {
  return new Promise((resolve, reject) => {
    const headers: Record<string, string> = { cookie };
    if (origin) headers.origin = origin;
    const socket = connect(url, { transports: ['websocket'], extraHeaders: headers, reconnection: false });
    const events: Event[] = [];
    let reason: string | null = null;
    socket.onAny((name, body) => events.push({ name, body }));
    socket.on('disconnect', (r) => (reason = r));
    socket.on('connect', () => resolve({ socket, events, disconnected: () => reason }));
    socket.on('connect_error', reject);
  });
}

/** How a refused handshake reads on the client: the transport's error and what the server's answer did to it. */
const refusal = (attempt: Promise<Listener>) =>
  attempt.then(
    (l) => {
      l.socket.close();
      return 'connected';
    },
    (err: Error & { description?: { message?: string } }) => `${err.message}: ${err.description?.message}`,
  );

const waitFor = async (check: () => boolean, ms = 10_000) => {
  const end = Date.now() + ms;
  while (!check()) {
    if (Date.now() > end) return false;
    await new Promise((r) => setTimeout(r, 50));
  }
  return true;
};

async function send(url: string, s: Session, method: string, path: string, body?: unknown) {
  const res = await fetch(`${url}${path}`, {
    method,
    headers: { cookie: s.cookie, 'x-csrf-token': s.csrf, 'content-type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  return { status: res.status, body: res.status === 204 ? null : await res.json() };
}

describe('live updates follow access', () => {
  useApi(); // empties the tables and opens the models for the factories
  let a: ServerProcess;
  let b: ServerProcess;
  let short: ServerProcess;
  const env = { SESSION_SECRET: 'a-shared-secret-for-both-test-instances', JOBS_ENABLED: 'false', FIGURES_THROTTLE_MS: '0', SOCKET_ADAPTER: 'postgres' };

  beforeAll(async () => {
    // One after another: three cold starts at once can starve a busy two-core machine.
    a = await startServerProcess(env, 90_000);
    b = await startServerProcess(env, 90_000);
    // A third instance whose sessions last 3.6 seconds after sign-in.
    short = await startServerProcess({ ...env, SESSION_ABSOLUTE_HOURS: '0.001', SOCKET_ADAPTER: 'memory' }, 90_000);
  }, 300_000);
  afterAll(async () => {
    await Promise.all([a?.stop(), b?.stop(), short?.stop()]);
  });

  /** A node in its own neighbourhood with a token, and a way to make it report once. */
  async function reportingNode(admin: Session, operators: { id: number }[] = []) {
    const hood = await buildNeighbourhood({ operators: operators as never });
    const node = await buildNode({ neighbourhoodId: hood.id });
    const { body } = await send(a.url, admin, 'POST', `/api/v1/nodes/${node.id}/ingest-token`);
    let seq = 0;
    const report = async () => {
      const res = await fetch(`${a.url}/api/v1/heartbeats`, {
        method: 'POST',
        headers: { authorization: `Bearer ${body.token}`, 'content-type': 'application/json' },
        body: JSON.stringify({ seq: ++seq, sentAt: new Date().toISOString(), radios: [{ iface: 'wlan0', signalDbm: -60, noiseDbm: -95 }] }),
      });
      expect(res.status).toBe(202);
    };
    return { hood, node, report };
  }
  const about = (l: Listener, nodeId: number) => l.events.filter((e) => e.body?.nodeId === nodeId);

  it('refuses a handshake from a foreign Origin and accepts the site’s own', async () => {
    const user = await buildUser({ role: 'operator' });
    const s = await signInAt(b.url, user.email);
    // socket.io's allowRequest refusal answers a WebSocket upgrade with 400 Bad Request.
    expect(await refusal(listen(b.url, s.cookie, 'https://elsewhere.example'))).toBe('websocket error: Unexpected server response: 400');
    expect(await refusal(listen(b.url, s.cookie, 'null'))).toBe('websocket error: Unexpected server response: 400');
    const own = await listen(b.url, s.cookie, b.url);
    expect(own.socket.connected).toBe(true);
    own.socket.close();
  });

  it('stops an operator hearing a neighbourhood the moment they are removed from it, and starts when added', async () => {
    const operator = await buildUser({ role: 'operator' });
    const admin = await signInAt(a.url, (await buildUser({ role: 'admin' })).email);
    const { hood, node, report } = await reportingNode(admin, [operator]);
    const op = await listen(b.url, (await signInAt(b.url, operator.email)).cookie);
    const watcher = await listen(b.url, (await signInAt(b.url, (await buildUser({ role: 'admin' })).email)).cookie);

    await report();
    expect(await waitFor(() => about(op, node.id).length > 0)).toBe(true); // hears it while assigned

    const removed = await send(a.url, admin, 'PUT', `/api/v1/neighbourhoods/${hood.id}/operators`, { userIds: [] });
    expect(removed.status).toBe(200);
    expect(await waitFor(() => op.events.some((e) => e.name === 'access:changed'))).toBe(true);
    expect(op.events.find((e) => e.name === 'access:changed')!.body.neighbourhoodIds).toEqual([]);
    expect(op.socket.connected).toBe(true); // still signed in, only deaf to that neighbourhood

    const heardBefore = about(op, node.id).length;
    const watcherBefore = about(watcher, node.id).length;
    await report();
    expect(await waitFor(() => about(watcher, node.id).length > watcherBefore)).toBe(true); // the event was sent
    await new Promise((r) => setTimeout(r, 400));
    expect(about(op, node.id).length).toBe(heardBefore);

    const added = await send(a.url, admin, 'PUT', `/api/v1/neighbourhoods/${hood.id}/operators`, { userIds: [operator.id] });
    expect(added.status).toBe(200);
    expect(await waitFor(() => op.events.filter((e) => e.name === 'access:changed').length === 2)).toBe(true);
    await report();
    expect(await waitFor(() => about(op, node.id).length > heardBefore)).toBe(true);
    for (const l of [op, watcher]) l.socket.close();
  }, 60_000);

  it('drops the neighbourhood rooms of an operator who becomes a host', async () => {
    const operator = await buildUser({ role: 'operator' });
    const admin = await signInAt(a.url, (await buildUser({ role: 'admin' })).email);
    const { node, report } = await reportingNode(admin, [operator]);
    const op = await listen(b.url, (await signInAt(b.url, operator.email)).cookie);
    const watcher = await listen(b.url, (await signInAt(b.url, (await buildUser({ role: 'admin' })).email)).cookie);

    expect((await send(a.url, admin, 'PATCH', `/api/v1/users/${operator.id}`, { role: 'host' })).status).toBe(200);
    expect(await waitFor(() => op.events.some((e) => e.name === 'access:changed'))).toBe(true);
    await report();
    expect(await waitFor(() => about(watcher, node.id).length > 0)).toBe(true);
    await new Promise((r) => setTimeout(r, 400));
    expect(about(op, node.id)).toEqual([]);
    for (const l of [op, watcher]) l.socket.close();
  }, 60_000);

  it('disconnects a deactivated person at once, on the other instance too', async () => {
    const person = await buildUser({ role: 'operator' });
    const admin = await signInAt(a.url, (await buildUser({ role: 'admin' })).email);
    const sock = await listen(b.url, (await signInAt(b.url, person.email)).cookie);
    const bystander = await listen(b.url, (await signInAt(b.url, (await buildUser({ role: 'operator' })).email)).cookie);

    expect((await send(a.url, admin, 'PATCH', `/api/v1/users/${person.id}`, { active: false })).status).toBe(200);
    expect(await waitFor(() => sock.disconnected() !== null)).toBe(true);
    expect(sock.disconnected()).toBe('io server disconnect');
    expect(bystander.socket.connected).toBe(true);
    bystander.socket.close();
  }, 60_000);

  it('ends a live connection when its session reaches its absolute lifetime', async () => {
    const person = await buildUser({ role: 'host' });
    const s = await signInAt(short.url, person.email);
    const sock = await listen(short.url, s.cookie);
    expect(await waitFor(() => sock.disconnected() !== null, 15_000)).toBe(true);
    expect(sock.disconnected()).toBe('io server disconnect');
    // And the session itself is over: no new connection, no API.
    // The ended session is refused before the upgrade, which socket.io answers with 400 Bad Request.
    expect(await refusal(listen(short.url, s.cookie))).toBe('websocket error: Unexpected server response: 400');
    expect((await fetch(`${short.url}/api/v1/me`, { headers: { cookie: s.cookie } })).status).toBe(401);
  }, 60_000);
});
