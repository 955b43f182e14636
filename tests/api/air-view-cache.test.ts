// The map and the overview share one computed air view for AIR_VIEW_CACHE_MS of the clock: a new report shows when
// it expires, an inventory edit through this process in the very next answer.
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { buildUser, call, signIn, type TestContext, unique, useApi } from '../helpers/api';
import { manualClock } from '../helpers/clock';
import { buildNeighbourhood, buildNode, buildRadio } from '../helpers/factories';

const LIFETIME_S = 60;
// Starts at the real time, so links created by the factories are not "older" than the reports.
const clock = manualClock(new Date().toISOString());

let macSerial = 0;
/** Two nodes of one operator's neighbourhood, each with a backhaul radio on wlan0 whose MAC is already known. */
async function pairScene(ctx: TestContext) {
  const hex = (++macSerial).toString(16).padStart(2, '0');
  const macs = [`02:00:5f:${hex}:00:0a`, `02:00:5f:${hex}:00:0b`];
  const operator = await buildUser({ role: 'operator' });
  const hood = await buildNeighbourhood({ operators: [operator] });
  const nodes = [
    await buildNode({ neighbourhoodId: hood.id, name: unique('Weir roof') }),
    await buildNode({ neighbourhoodId: hood.id, name: unique('Mill roof') }),
  ];
  const radios = [await buildRadio({ nodeId: nodes[0].id }), await buildRadio({ nodeId: nodes[1].id })];
  const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
  const tokens: string[] = [];
  for (const node of nodes) tokens.push((await call(admin, 'post', `/api/v1/nodes/${node.id}/ingest-token`)).body.token);
  const seqs = [0, 0];
  const report = async (i: 0 | 1, radio: object) => {
    const res = await request(ctx.app)
      .post('/api/v1/heartbeats')
      .set('Authorization', `Bearer ${tokens[i]}`)
      .send({ seq: ++seqs[i], sentAt: clock.now().toISOString(), radios: [{ iface: 'wlan0', mac: macs[i], ...radio }] });
    expect(res.status).toBe(202);
  };
  await report(0, {});
  await report(1, {});
  const agent = await signIn(ctx, operator);
  const topology = async () => {
    const res = await call(agent, 'get', '/api/v1/topology');
    expect(res.status).toBe(200);
    return res.body.data as { links: { id: number; observed: boolean }[]; discoveredLinks: { radioAId: number; radioBId: number }[] };
  };
  return { macs, radios, report, agent, topology };
}

describe('the air view the map and the overview share', () => {
  const ctx = useApi({ now: clock.now, airViewCacheMs: LIFETIME_S * 1000 });

  it('answers from one computed view for its lifetime; a new sighting shows once it expires, on the map and the overview', async () => {
    const s = await pairScene(ctx);
    expect((await s.topology()).discoveredLinks).toEqual([]);
    // The MACs are known already, so this report changes no inventory: the shared view stands until it expires.
    await s.report(1, { peerMac: s.macs[0], signalDbm: -63 });
    expect((await s.topology()).discoveredLinks).toEqual([]);
    expect((await call(s.agent, 'get', '/api/v1/overview')).body.data.discoveredLinkCount).toBe(0);

    clock.advance(LIFETIME_S);
    expect((await s.topology()).discoveredLinks).toEqual([expect.objectContaining({ radioAId: s.radios[0].id, radioBId: s.radios[1].id, signalDbm: -63 })]);
    expect((await call(s.agent, 'get', '/api/v1/overview')).body.data.discoveredLinkCount).toBe(1);
  });

  it('shows a link added, a radio edited and a link removed through the API in the very next answer', async () => {
    const s = await pairScene(ctx);
    await s.report(1, { peerMac: s.macs[0], signalDbm: -63 });
    clock.advance(LIFETIME_S);
    expect((await s.topology()).discoveredLinks).toHaveLength(1);

    const added = await call(s.agent, 'post', '/api/v1/links', { radioAId: s.radios[0].id, radioBId: s.radios[1].id, status: 'live' });
    expect(added.status).toBe(201);
    const withLink = await s.topology();
    expect(withLink.discoveredLinks).toEqual([]);
    expect(withLink.links).toEqual([expect.objectContaining({ id: added.body.data.id, observed: true })]);

    // The reporting radio now sits on another interface: the reports on wlan0 no longer name this link's end.
    expect((await call(s.agent, 'patch', `/api/v1/radios/${s.radios[1].id}`, { iface: 'wlan1' })).status).toBe(200);
    expect((await s.topology()).links).toEqual([expect.objectContaining({ id: added.body.data.id, observed: false })]);

    expect((await call(s.agent, 'delete', `/api/v1/links/${added.body.data.id}`)).status).toBe(204);
    expect((await s.topology()).links).toEqual([]);
  });
});
