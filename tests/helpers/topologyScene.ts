import request from 'supertest';
import { expect } from 'vitest';
import { Link, type Node, Radio, type User } from '../../server/models';
import { buildUser, call, signIn, type TestContext, unique } from './api';
import { setPreferences } from './alertScene';
import { buildNeighbourhood, buildNode, buildSite } from './factories';

let spot = 0;

/** A node on its own site (placed a little apart from the last), hosted by a new host. */
async function hostedNode(neighbourhoodId: number, name: string, isUplink = false) {
  const host = await buildUser({ role: 'host', name: `Host of ${name}` });
  spot++;
  const site = await buildSite({
    neighbourhoodId,
    hostUserId: host.id,
    name: `${name} roof`,
    latitude: 47.6 + (spot % 50) * 0.002,
    longitude: -38.4 + Math.floor(spot / 50) * 0.002,
  });
  const node = await buildNode({ siteId: site.id, name, isUplink });
  return { node, host };
}

const radioCount = new Map<number, number>();
/** A live point-to-point link between two nodes, each end on a radio of its own. */
export async function liveLink(a: Node, b: Node) {
  const radio = async (n: Node) => {
    const i = (radioCount.get(n.id) ?? 0) + 1;
    radioCount.set(n.id, i);
    return Radio.create({
      nodeId: n.id,
      iface: `wlan${i}`,
      band: '5',
      channel: 36,
      channelWidthMHz: 20,
      txPowerDbm: 18,
      antennaGainDbi: 23,
      role: 'backhaul-ap',
      ssid: 'bh',
      encryption: 'wpa2-ccmp',
      preSharedKey: 'a-long-enough-test-key',
    });
  };
  return Link.create({ radioAId: (await radio(a)).id, radioBId: (await radio(b)).id, status: 'live' });
}

/**
 * uplink ─ backhaul ─ ten leaves (their own neighbourhood);  uplink ─ relay ─ far leaf (a second branch);
 * a node with two paths (backhaul and relay). The first leaf's host opted into upstream notices.
 */
export async function topologyScene(ctx: TestContext, clock: { advance: (s: number) => void }) {
  const coreOperator = await buildUser({ role: 'operator', name: unique('Core operator') });
  const leafOperator = await buildUser({ role: 'operator', name: unique('Reedbank operator') });
  const admin = await buildUser({ role: 'admin' });
  const core = await buildNeighbourhood({ name: unique('Core'), operators: [coreOperator] });
  const reedbank = await buildNeighbourhood({ name: unique('Reedbank'), operators: [leafOperator] });
  const tag = unique('t');
  const uplink = await hostedNode(core.id, `${tag}-uplink`, true);
  const backhaul = await hostedNode(core.id, `${tag}-backhaul`);
  const relay = await hostedNode(core.id, `${tag}-relay`);
  const farLeaf = await hostedNode(core.id, `${tag}-far`);
  const twoPaths = await hostedNode(core.id, `${tag}-twopaths`);
  const leaves: Awaited<ReturnType<typeof hostedNode>>[] = [];
  for (let i = 1; i <= 10; i++) leaves.push(await hostedNode(reedbank.id, `${tag}-leaf${String(i).padStart(2, '0')}`));
  await liveLink(uplink.node, backhaul.node);
  await liveLink(uplink.node, relay.node);
  await liveLink(relay.node, farLeaf.node);
  await liveLink(backhaul.node, twoPaths.node);
  await liveLink(relay.node, twoPaths.node);
  for (const l of leaves) await liveLink(backhaul.node, l.node);
  await setPreferences(leaves[0].host.id, { upstreamNotices: true });

  const adminAgent = await signIn(ctx, admin);
  const all = [uplink, backhaul, relay, farLeaf, twoPaths, ...leaves];
  const tokens = new Map<number, string>();
  const seqs = new Map<number, number>();
  for (const { node } of all) {
    const res = await call(adminAgent, 'post', `/api/v1/nodes/${node.id}/ingest-token`);
    expect(res.status).toBe(201);
    tokens.set(node.id, res.body.token);
  }
  /** One report; a leaf's access point serves (leaf number) clients. */
  const report = async (node: Node) => {
    const seq = (seqs.get(node.id) ?? 0) + 1;
    seqs.set(node.id, seq);
    const clients = leaves.findIndex((l) => l.node.id === node.id) + 1;
    const res = await request(ctx.app)
      .post('/api/v1/heartbeats')
      .set('Authorization', `Bearer ${tokens.get(node.id)}`)
      .send({
        seq,
        sentAt: new Date().toISOString(),
        uptimeS: 3600,
        throughputMbps: 40,
        radios: [
          { iface: 'wlan1', signalDbm: -60, noiseDbm: -95 },
          { iface: 'ap0', role: 'access-point', signalDbm: -50, noiseDbm: -95, clients },
        ],
      });
    expect(res.status).toBe(202);
  };
  const reportAll = async (nodes = all.map((x) => x.node)) => {
    for (const n of nodes) await report(n);
  };
  /** Lets `seconds` pass in steps of one report interval, the given nodes reporting after each step as healthy nodes do. */
  const runFor = async (seconds: number, healthy: Node[]) => {
    for (let left = seconds; left > 0; left -= 60) {
      clock.advance(Math.min(60, left));
      await reportAll(healthy);
    }
  };
  const hosts = all.map((x) => x.host);
  const people = (): User[] => [coreOperator, leafOperator, admin, ...hosts];
  return {
    coreOperator,
    leafOperator,
    admin,
    core,
    reedbank,
    uplink,
    backhaul,
    relay,
    farLeaf,
    twoPaths,
    leaves,
    all,
    report,
    reportAll,
    runFor,
    adminAgent,
    people,
  };
}
