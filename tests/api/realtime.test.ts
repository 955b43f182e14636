import { io as connect, type Socket } from 'socket.io-client';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Node, Site } from '../../server/models';
import { PASSWORD, buildUser, useApi } from '../helpers/api';
import { buildNeighbourhood, buildNode } from '../helpers/factories';
import { sessionCookieOf } from '../../server/tools/apiClient';
import { startServerProcess, type ServerProcess } from '../../server/tools/serverProcess';

/** Signs in over HTTP and returns the session cookie and CSRF token. */
async function signInAt(url: string, email: string) {
  const res = await fetch(`${url}/api/v1/session`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status}`);
  const cookie = sessionCookieOf(res);
  return { cookie, csrf: (await res.json()).csrfToken as string };
}

function listen(url: string, cookie: string): Promise<{ socket: Socket; events: { name: string; body: { nodeId: number; state?: string } }[] }> {
  return new Promise((resolve, reject) => {
    const socket = connect(url, { transports: ['websocket'], extraHeaders: { cookie }, reconnection: false });
    const events: { name: string; body: { nodeId: number } }[] = [];
    socket.onAny((name, body) => events.push({ name, body }));
    socket.on('connect', () => resolve({ socket, events }));
    socket.on('connect_error', reject);
  });
}

const waitFor = async (check: () => boolean, ms = 8000) => {
  const end = Date.now() + ms;
  while (!check()) {
    if (Date.now() > end) return false;
    await new Promise((r) => setTimeout(r, 50));
  }
  return true;
};

describe('live updates across two server processes', () => {
  useApi();
  let a: ServerProcess;
  let b: ServerProcess;
  const env = { SESSION_SECRET: 'a-shared-secret-for-both-test-instances', JOBS_ENABLED: 'false', FIGURES_THROTTLE_MS: '0', SOCKET_ADAPTER: 'postgres' };

  beforeAll(async () => {
    [a, b] = await Promise.all([startServerProcess(env, 90_000), startServerProcess(env, 90_000)]);
  }, 90_000);
  afterAll(async () => {
    await Promise.all([a?.stop(), b?.stop()]);
  });

  it('refuses a socket without a session', async () => {
    // The websocket upgrade is refused, so the client sees its transport fail, not a connection.
    await expect(listen(b.url, 'parapet.sid=nothing')).rejects.toThrow('websocket error');
    // The same handshake over HTTP says why, in the API's error shape.
    const res = await fetch(`${b.url}/socket.io/?EIO=4&transport=polling`, { headers: { cookie: 'parapet.sid=nothing' } });
    expect(res.status).toBe(401);
    expect(await res.json()).toEqual({ error: { code: 'not_signed_in', message: 'Sign in to receive live updates.' } });
  });

  it('delivers a report posted to one process to a browser on the other, and only to rooms that may read it', async () => {
    const operator = await buildUser({ role: 'operator' });
    const hostHere = await buildUser({ role: 'host' });
    const hostElsewhere = await buildUser({ role: 'host' });
    const hood = await buildNeighbourhood({ operators: [operator] });
    const otherHood = await buildNeighbourhood();
    const node = await buildNode({ neighbourhoodId: hood.id });
    await Site.update({ hostUserId: hostHere.id }, { where: { id: node.siteId } });
    const elsewhere = await buildNode({ neighbourhoodId: otherHood.id });
    await Site.update({ hostUserId: hostElsewhere.id }, { where: { id: elsewhere.siteId } });

    const admin = await buildUser({ role: 'admin' });
    const adminSession = await signInAt(a.url, admin.email);
    const tokenRes = await fetch(`${a.url}/api/v1/nodes/${node.id}/ingest-token`, {
      method: 'POST',
      headers: { cookie: adminSession.cookie, 'x-csrf-token': adminSession.csrf },
    });
    const { token } = await tokenRes.json();

    const opSock = await listen(b.url, (await signInAt(b.url, operator.email)).cookie);
    const hostSock = await listen(b.url, (await signInAt(b.url, hostHere.email)).cookie);
    const otherSock = await listen(b.url, (await signInAt(b.url, hostElsewhere.email)).cookie);
    await new Promise((r) => setTimeout(r, 300)); // let the rooms settle on every instance

    const post = await fetch(`${a.url}/api/v1/heartbeats`, {
      method: 'POST',
      headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' },
      body: JSON.stringify({ seq: 1, sentAt: new Date().toISOString(), radios: [{ iface: 'wlan0', signalDbm: -61, noiseDbm: -95 }] }),
    });
    expect(post.status).toBe(202);

    const stateFor = (evs: { name: string; body: { nodeId: number; state?: string } }[]) =>
      evs.find((e) => e.name === 'node:state' && e.body.nodeId === node.id);
    expect(await waitFor(() => !!stateFor(opSock.events) && !!stateFor(hostSock.events))).toBe(true);
    expect(stateFor(opSock.events)!.body.state).toBe('online');
    expect(opSock.events.some((e) => e.name === 'node:figures' && e.body.nodeId === node.id)).toBe(true);
    await new Promise((r) => setTimeout(r, 500));
    expect(otherSock.events).toEqual([]); // a host of another neighbourhood hears nothing
    expect((await Node.findByPk(node.id))!.state).toBe('online');
    for (const s of [opSock, hostSock, otherSock]) s.socket.close();
  });
});
