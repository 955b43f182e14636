import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { Radio } from '../../server/models';
import { buildUser, call, signIn, type TestContext, unique, useApi } from '../helpers/api';
import { manualClock } from '../helpers/clock';
import { buildNeighbourhood, buildNode, buildRadio } from '../helpers/factories';

// Starts at the real time, so links created by the factories are not "older" than the reports.
const clock = manualClock(new Date().toISOString());

// Each test takes its own pair of MACs (the database is shared by the file's tests).
let macSerial = 0;
const macPair = () => {
  macSerial++;
  const hex = macSerial.toString(16).padStart(2, '0');
  return [`02:00:5e:${hex}:00:0a`, `02:00:5e:${hex}:00:0b`];
};

async function tokenFor(ctx: TestContext, nodeId: number) {
  const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
  const res = await call(admin, 'post', `/api/v1/nodes/${nodeId}/ingest-token`);
  expect(res.status).toBe(201);
  return res.body.token as string;
}

/** Two nodes in one neighbourhood, each with a backhaul radio on wlan0 and its own token. */
async function pairScene(ctx: TestContext) {
  const operator = await buildUser({ role: 'operator' });
  const hood = await buildNeighbourhood({ operators: [operator] });
  const a = await buildNode({ neighbourhoodId: hood.id, name: unique('Mill roof') });
  const b = await buildNode({ neighbourhoodId: hood.id, name: unique('Chapel roof') });
  const radioA = await buildRadio({ nodeId: a.id, iface: 'wlan0' });
  const radioB = await buildRadio({ nodeId: b.id, iface: 'wlan0' });
  const tokens = new Map([
    [a.id, await tokenFor(ctx, a.id)],
    [b.id, await tokenFor(ctx, b.id)],
  ]);
  const seqs = new Map<number, number>();
  const report = async (nodeId: number, radio: object) => {
    const seq = (seqs.get(nodeId) ?? 0) + 1;
    seqs.set(nodeId, seq);
    const res = await request(ctx.app)
      .post('/api/v1/heartbeats')
      .set('Authorization', `Bearer ${tokens.get(nodeId)}`)
      .send({ seq, sentAt: clock.now().toISOString(), radios: [{ iface: 'wlan0', ...radio }] });
    expect(res.status).toBe(202);
  };
  return { operator, hood, a, b, radioA, radioB, report, agent: await signIn(ctx, operator) };
}

const topology = async (agent: Parameters<typeof call>[0]) => {
  const res = await call(agent, 'get', '/api/v1/topology');
  expect(res.status).toBe(200);
  return res.body.data;
};

describe('radios learn their MAC and links are discovered from reports', () => {
  const ctx = useApi({ now: clock.now });

  it('two nodes naming each other appear as a discovered link; adding it to the inventory clears the finding', async () => {
    const [MAC_A, MAC_B] = macPair();
    const s = await pairScene(ctx);
    // Upper-case from the node, stored in one spelling.
    await s.report(s.a.id, { mac: MAC_A.toUpperCase(), peerMac: MAC_B, signalDbm: -61 });
    clock.advance(20);
    await s.report(s.b.id, { mac: MAC_B, peerMac: MAC_A.toUpperCase(), signalDbm: -64 });

    const radio = await call(s.agent, 'get', `/api/v1/radios/${s.radioA.id}`);
    expect(radio.status).toBe(200);
    expect(radio.body.data.mac).toBe(MAC_A);

    const before = await topology(s.agent);
    expect(before.links).toEqual([]);
    expect(before.discoveredLinks).toEqual([
      {
        nodeAId: s.a.id,
        nodeBId: s.b.id,
        radioAId: s.radioA.id,
        radioBId: s.radioB.id,
        signalDbm: -64,
        lastSeenAt: clock.now().toISOString(),
        abilities: { add: true },
      },
    ]);

    // The map's "add to the inventory" posts exactly the pair it shows.
    const d = before.discoveredLinks[0];
    const added = await call(s.agent, 'post', '/api/v1/links', { radioAId: d.radioAId, radioBId: d.radioBId, status: 'live' });
    expect(added.status).toBe(201);

    const after = await topology(s.agent);
    expect(after.discoveredLinks).toEqual([]);
    expect(after.links).toHaveLength(1);
    expect(after.links[0]).toMatchObject({ id: added.body.data.id, observed: true, observedSignalDbm: -64, plannedButSilent: false });
  });

  it('a link stops being observed 15 minutes after the last report naming its peer, and is flagged silent after a day', async () => {
    const [MAC_A, MAC_B] = macPair();
    const s = await pairScene(ctx);
    const link = await call(s.agent, 'post', '/api/v1/links', { radioAId: s.radioA.id, radioBId: s.radioB.id, status: 'live' });
    expect(link.status).toBe(201);
    // Before any MAC is known nobody could recognise the link on the air: not observed, not "silent" either.
    clock.advance(2 * 86_400);
    expect((await topology(s.agent)).links[0]).toMatchObject({ observed: false, observedSignalDbm: null, lastObservedAt: null, plannedButSilent: false });

    await s.report(s.b.id, { mac: MAC_B });
    await s.report(s.a.id, { mac: MAC_A, peerMac: MAC_B, signalDbm: -58 });
    expect((await topology(s.agent)).links[0]).toMatchObject({ observed: true, observedSignalDbm: -58, plannedButSilent: false });

    clock.advance(14 * 60);
    expect((await topology(s.agent)).links[0].observed).toBe(true);
    clock.advance(61);
    expect((await topology(s.agent)).links[0]).toMatchObject({ observed: false, observedSignalDbm: null, plannedButSilent: false });

    // Both nodes keep reporting, but neither names the other any more (an antenna re-aimed).
    clock.advance(86_400 - 15 * 60);
    await s.report(s.a.id, { mac: MAC_A, signalDbm: -90 });
    await s.report(s.b.id, { mac: MAC_B });
    const silent = (await topology(s.agent)).links[0];
    // The last sighting now lies beyond the day Parapet looks back over.
    expect(silent).toMatchObject({ observed: false, observedSignalDbm: null, lastObservedAt: null, plannedButSilent: true });
    // The overview flags it too, for the operator who looks after either end.
    const overview = await call(s.agent, 'get', '/api/v1/overview');
    expect(overview.status).toBe(200);
    expect(overview.body.data.silentLinks).toEqual([
      { id: link.body.data.id, name: null, status: 'live', nodeAId: s.a.id, nodeAName: s.a.name, nodeBId: s.b.id, nodeBName: s.b.name, lastObservedAt: null },
    ]);
  });

  it('a MAC that turns up on another node is shown as a moved radio and the old radio forgets it', async () => {
    const [MAC_A] = macPair();
    const s = await pairScene(ctx);
    const c = await buildNode({ neighbourhoodId: s.hood.id, name: unique('Bakery roof') });
    const radioC = await buildRadio({ nodeId: c.id, iface: 'wlan1' });
    const tokenC = await tokenFor(ctx, c.id);
    await s.report(s.a.id, { mac: MAC_A });
    clock.advance(3600);
    // The radio that was on the mill now reports from the bakery, on another interface name.
    const res = await request(ctx.app)
      .post('/api/v1/heartbeats')
      .set('Authorization', `Bearer ${tokenC}`)
      .send({ seq: 1, sentAt: clock.now().toISOString(), radios: [{ iface: 'wlan1', mac: MAC_A }] });
    expect(res.status).toBe(202);

    expect((await Radio.findByPk(s.radioA.id))!.mac).toBeNull();
    expect((await Radio.findByPk(radioC.id))!.mac).toBe(MAC_A);
    const moves = (await topology(s.agent)).radioMoves.filter((m: { mac: string }) => m.mac === MAC_A);
    expect(moves).toEqual([
      expect.objectContaining({
        mac: MAC_A,
        fromNodeId: s.a.id,
        fromNodeName: s.a.name,
        fromIface: 'wlan0',
        toNodeId: c.id,
        toNodeName: c.name,
        toIface: 'wlan1',
        at: clock.now().toISOString(),
      }),
    ]);

    const overview = await call(s.agent, 'get', '/api/v1/overview');
    expect(overview.body.data.radioMoves.map((m: { mac: string; toNodeId: number }) => [m.mac, m.toNodeId])).toContainEqual([MAC_A, c.id]);

    // Reported again by the bakery: the move is recorded once.
    await request(ctx.app)
      .post('/api/v1/heartbeats')
      .set('Authorization', `Bearer ${tokenC}`)
      .send({ seq: 2, sentAt: clock.now().toISOString(), radios: [{ iface: 'wlan1', mac: MAC_A }] });
    expect((await topology(s.agent)).radioMoves.filter((m: { mac: string }) => m.mac === MAC_A)).toHaveLength(1);
  });

  it('shows discovered pairs only to people who may read both nodes', async () => {
    const s = await pairScene(ctx);
    await s.report(s.a.id, { mac: '02:00:5e:10:01:0a', peerMac: '02:00:5e:10:01:0b', signalDbm: -70 });
    await s.report(s.b.id, { mac: '02:00:5e:10:01:0b' });
    const mine = await topology(s.agent);
    expect(mine.discoveredLinks.filter((d: { nodeAId: number }) => d.nodeAId === s.a.id)).toHaveLength(1);

    const stranger = await signIn(ctx, await buildUser({ role: 'operator' }));
    expect((await topology(stranger)).discoveredLinks).toEqual([]);
    const host = await signIn(ctx, await buildUser({ role: 'host' }));
    expect((await topology(host)).discoveredLinks).toEqual([]);
  });

  it('refuses a malformed own MAC with 400 naming the field, storing nothing of the batch', async () => {
    const [MAC_A] = macPair();
    const s = await pairScene(ctx);
    const token = await tokenFor(ctx, s.a.id);
    const res = await request(ctx.app)
      .post('/api/v1/heartbeats')
      .set('Authorization', `Bearer ${token}`)
      .send({
        reports: [
          { seq: 1, sentAt: clock.now().toISOString(), radios: [{ iface: 'wlan0', mac: MAC_A }] },
          { seq: 2, sentAt: clock.now().toISOString(), radios: [{ iface: 'wlan0', mac: '02:00:5e:10:00' }] },
        ],
      });
    expect(res.status).toBe(400);
    expect(res.body.error.details).toEqual([
      { path: 'reports.1.radios.0.mac', message: 'reports.1.radios.0.mac must be a MAC address like 02:00:5e:10:00:01' },
    ]);
    expect((await Radio.findByPk(s.radioA.id))!.mac).toBeNull();
    const numeric = await request(ctx.app)
      .post('/api/v1/heartbeats')
      .set('Authorization', `Bearer ${token}`)
      .send({ seq: 3, sentAt: clock.now().toISOString(), radios: [{ iface: 'wlan0', mac: 42 }] });
    expect(numeric.status).toBe(400);
    expect(numeric.body.error.details[0].path).toBe('radios.0.mac');
  });
});
