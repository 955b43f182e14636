import { QueryTypes } from 'sequelize';
import { beforeEach, describe, expect, it } from 'vitest';
import { Node, Outage } from '../../server/models';
import { call, signIn, useApi } from '../helpers/api';
import { sendOutbox, silenceCheck } from '../helpers/alertScene';
import { manualClock } from '../helpers/clock';
import { clearInbox, mailTo } from '../helpers/mailFake';
import { topologyScene } from '../helpers/topologyScene';

const clock = manualClock();
// Report interval 60 s and three missed intervals: offline 180 s after the last report.
const OFFLINE_AFTER_S = 181;
let day = 1;

const stateOf = async (n: { id: number }) => (await Node.findByPk(n.id))!.state;
const mailOf = async (users: { email: string }[]) => mailTo(users.map((u) => u.email));

describe('topology-aware outages', () => {
  const ctx = useApi({ now: clock.now });
  beforeEach(async () => {
    clock.set(`2026-08-${String(day++).padStart(2, '0')}T12:00:00Z`);
    ctx.config.alertGraceS = null;
    await silenceCheck(ctx); // earlier tests' nodes go quiet here, before this test's people exist
    await sendOutbox(ctx);
    await clearInbox();
  });

  it('a silent backhaul is one root outage with ten stranded nodes behind it, and the right mail to each person', async () => {
    const s = await topologyScene(ctx, clock);
    await s.reportAll();
    await s.runFor(OFFLINE_AFTER_S, [s.uplink.node, s.relay.node, s.farLeaf.node, s.twoPaths.node]);
    await silenceCheck(ctx); // the backhaul and its ten leaves last reported together
    await sendOutbox(ctx);
    await sendOutbox(ctx);

    expect(await stateOf(s.backhaul.node)).toBe('offline');
    for (const l of s.leaves) expect(await stateOf(l.node)).toBe('stranded');
    expect(await stateOf(s.twoPaths.node)).toBe('online'); // its second path runs through the relay
    const outages = await Outage.findAll({ where: { endedAt: null } });
    const mine = outages.filter((o) => [s.backhaul, ...s.leaves, s.twoPaths].some((x) => x.node.id === o.nodeId));
    expect(mine.map((o) => o.nodeId)).toEqual([s.backhaul.node.id]);
    const root = mine[0];
    expect(root.blastNodeCount).toBe(10);
    expect(root.blastClients).toBe(55); // leaves serve 1 + 2 + … + 10 clients

    const mail = await mailOf(s.people());
    const to = (u: { email: string }) => mail.filter((m) => m.to[0].address === u.email);
    // Operators: one mail each (the root's neighbourhood and the one cut off), listing what sits behind it.
    for (const op of [s.coreOperator, s.leafOperator]) {
      expect(to(op)).toHaveLength(1);
      expect(to(op)[0].subject).toMatch(new RegExp(`^Offline: ${s.backhaul.node.name} .*, 10 nodes cut off behind it$`));
      expect(to(op)[0].text).toContain('CUT OFF BEHIND IT: 10 NODES CUT OFF, 55 CLIENTS AT THEIR LAST REPORT'); // headings are upper case in the text part
      for (const l of s.leaves) expect(to(op)[0].text).toContain(l.node.name);
    }
    expect(to(s.coreOperator)[0].text).toMatch(/acknowledge\?t=/);
    // The root's host gets the checklist; the downstream hosts never do; the opted-in one gets one short notice.
    expect(to(s.backhaul.host).map((m) => m.subject)).toEqual([`The network box on your roof (${s.backhaul.node.name}) has stopped answering`]);
    expect(to(s.leaves[0].host)).toHaveLength(1);
    expect(to(s.leaves[0].host)[0].subject).toBe(`The network upstream of your node (${s.leaves[0].node.name}) is down; nothing is needed from you`);
    expect(to(s.leaves[0].host)[0].text).toContain('Nothing is needed from you');
    expect(to(s.leaves[0].host)[0].text).not.toContain('Power:');
    for (const l of s.leaves.slice(1)) expect(to(l.host)).toHaveLength(0);
    expect(mail.filter((m) => m.text.includes('Power: is its plug in'))).toHaveLength(1);
    expect(mail).toHaveLength(4);
    const outbox = await ctx.sequelize.query<{ kind: string }>('SELECT kind FROM outbox WHERE outage_id = $1 ORDER BY id', {
      bind: [root.id],
      type: QueryTypes.SELECT,
    });
    expect(outbox.map((r) => r.kind).sort()).toEqual(['node-offline', 'node-offline', 'node-offline', 'upstream-notice']);

    // Blast radius in the API: the outage list sorts by it, the overview leads with it, the topology marks the cut.
    const admin = s.adminAgent;
    const list = await call(admin, 'get', '/api/v1/outages?status=open&sort=-blastRadius');
    expect(list.status).toBe(200);
    expect(list.body.data[0].id).toBe(root.id);
    expect(list.body.data[0].blastRadius).toEqual({
      nodeCount: 10,
      neighbourhoodIds: [s.reedbank.id],
      clients: 55,
      nodeIds: s.leaves.map((l) => l.node.id).sort((a, b) => a - b),
    });
    const asc = await call(admin, 'get', '/api/v1/outages?status=open&sort=blastRadius');
    expect(asc.body.data.at(-1).id).toBe(root.id);
    const coreOp = await signIn(ctx, s.coreOperator);
    const scoped = await call(coreOp, 'get', `/api/v1/outages/${root.id}`);
    expect(scoped.body.data.blastRadius).toMatchObject({ nodeCount: 10, clients: 55, nodeIds: [] }); // counts whole; ids only where readable
    const overview = await call(admin, 'get', '/api/v1/overview');
    expect(overview.body.data.openOutages[0]).toMatchObject({ id: root.id, blastNodeCount: 10, blastClients: 55 });
    const topo = await call(admin, 'get', '/api/v1/topology');
    const byId = new Map<number, { state: string; strandedBy: number | null; openOutageId: number | null; blastNodeCount: number }>(
      topo.body.data.nodes.map((n: { id: number }) => [n.id, n]),
    );
    expect(byId.get(s.backhaul.node.id)).toMatchObject({ state: 'offline', openOutageId: root.id, blastNodeCount: 10, strandedBy: null });
    for (const l of s.leaves) expect(byId.get(l.node.id)).toMatchObject({ state: 'stranded', strandedBy: root.id, openOutageId: null });
    expect((await call(admin, 'get', '/api/v1/outages?sort=blastFoo')).status).toBe(400);
  });

  it('when the root recovers, the nodes that report are online and the one still dead gets its own outage after the grace', async () => {
    const s = await topologyScene(ctx, clock);
    const healthy = [s.uplink.node, s.relay.node, s.farLeaf.node, s.twoPaths.node];
    await s.reportAll();
    await s.runFor(OFFLINE_AFTER_S, healthy);
    await silenceCheck(ctx);
    await sendOutbox(ctx);
    await clearInbox();
    expect(await stateOf(s.leaves[9].node)).toBe('stranded');

    await s.runFor(600, healthy);
    await s.reportAll([s.backhaul.node, ...s.leaves.slice(0, 9).map((l) => l.node)]);
    await silenceCheck(ctx);
    expect(await stateOf(s.backhaul.node)).toBe('online');
    for (const l of s.leaves.slice(0, 9)) expect(await stateOf(l.node)).toBe('online');
    expect(await stateOf(s.leaves[9].node)).toBe('stranded'); // still inside its grace from the root's return

    const alive = s.all.filter((x) => x !== s.leaves[9]).map((x) => x.node);
    await s.runFor(OFFLINE_AFTER_S - 61, alive);
    await silenceCheck(ctx);
    expect(await stateOf(s.leaves[9].node)).toBe('stranded');
    await s.runFor(60, alive);
    await silenceCheck(ctx);
    await sendOutbox(ctx);
    expect(await stateOf(s.leaves[9].node)).toBe('offline');
    const own = await Outage.findOne({ where: { nodeId: s.leaves[9].node.id, endedAt: null } });
    expect(own).not.toBeNull();
    expect(own!.blastNodeCount).toBe(0);

    const mail = await mailOf(s.people());
    const subjects = (u: { email: string }) => mail.filter((m) => m.to[0].address === u.email).map((m) => m.subject);
    expect(subjects(s.backhaul.host)).toEqual([`The network box on your roof (${s.backhaul.node.name}) is back`]);
    expect(subjects(s.coreOperator).filter((x) => x.startsWith('Back online:'))).toHaveLength(1);
    expect(subjects(s.leaves[9].host)).toEqual([`The network box on your roof (${s.leaves[9].node.name}) has stopped answering`]);
    expect(subjects(s.leafOperator).filter((x) => x.startsWith(`Offline: ${s.leaves[9].node.name}`))).toHaveLength(1);
    for (const l of s.leaves.slice(0, 9)) expect(subjects(l.host)).toEqual([]);
  });

  it('a node with a second path is its own root when it goes silent; a relay failure strands only what depends on it', async () => {
    const s = await topologyScene(ctx, clock);
    await s.reportAll();
    // The backhaul and the two-path node stop together; the two-path node still had a path through the relay.
    await s.runFor(OFFLINE_AFTER_S, [s.uplink.node, s.relay.node, s.farLeaf.node, ...s.leaves.map((l) => l.node)]);
    await silenceCheck(ctx);
    expect(await stateOf(s.twoPaths.node)).toBe('offline');
    expect(await stateOf(s.backhaul.node)).toBe('offline');
    expect(await Outage.count({ where: { nodeId: s.twoPaths.node.id, endedAt: null } })).toBe(1);
    expect((await Outage.findOne({ where: { nodeId: s.backhaul.node.id, endedAt: null } }))!.blastNodeCount).toBe(0);
    for (const l of s.leaves) expect(await stateOf(l.node)).toBe('online');

    await s.runFor(OFFLINE_AFTER_S + 60, [s.uplink.node, s.twoPaths.node, s.backhaul.node, ...s.leaves.map((l) => l.node)]);
    await silenceCheck(ctx); // the relay and the far leaf stopped; the two-path node keeps its path through the backhaul
    expect(await stateOf(s.relay.node)).toBe('offline');
    expect(await stateOf(s.farLeaf.node)).toBe('stranded');
    expect(await stateOf(s.twoPaths.node)).toBe('online');
    expect((await Outage.findOne({ where: { nodeId: s.relay.node.id, endedAt: null } }))!.blastNodeCount).toBe(1);
  });

  it('waits for an upstream node that has missed a report, so a leaf that goes quiet first is not blamed', async () => {
    const s = await topologyScene(ctx, clock);
    const healthy = [s.uplink.node, s.relay.node, s.farLeaf.node, s.twoPaths.node];
    await s.reportAll();
    await s.runFor(45, [...healthy, s.backhaul.node]);
    await s.runFor(OFFLINE_AFTER_S - 45, healthy);
    await silenceCheck(ctx); // leaves silent, the backhaul overdue but not yet judged
    for (const l of s.leaves) expect(await stateOf(l.node)).toBe('online');
    await s.runFor(45, healthy);
    await silenceCheck(ctx);
    expect(await stateOf(s.backhaul.node)).toBe('offline');
    for (const l of s.leaves) expect(await stateOf(l.node)).toBe('stranded');
    expect((await Outage.findOne({ where: { nodeId: s.backhaul.node.id, endedAt: null } }))!.blastNodeCount).toBe(10);
  });

  it('the whole network silent at once, uplink included, is one self-check to each admin and no outage or host mail', async () => {
    const s = await topologyScene(ctx, clock);
    await s.reportAll();
    clock.advance(OFFLINE_AFTER_S);
    await silenceCheck(ctx);
    await sendOutbox(ctx);
    for (const x of s.all) expect(await stateOf(x.node)).toBe('stranded');
    expect(await Outage.count({ where: { nodeId: s.all.map((x) => x.node.id) } })).toBe(0);
    const mail = await mailOf(s.people());
    expect(mail).toHaveLength(1);
    expect(mail[0].to[0].address).toBe(s.admin.email);
    expect(mail[0].subject).toBe(`Parapet lost sight of the network behind ${s.uplink.node.name} (15 nodes)`);
    const kinds = await ctx.sequelize.query<{ kind: string }>('SELECT kind FROM outbox WHERE recipient_user_id = $1', {
      bind: [s.admin.id],
      type: QueryTypes.SELECT,
    });
    expect(kinds.map((k) => k.kind)).toEqual(['self-check']);
    // Later checks add nothing; reports bring the nodes back without mail.
    clock.advance(60);
    await silenceCheck(ctx);
    await s.reportAll();
    await silenceCheck(ctx);
    await sendOutbox(ctx);
    for (const x of s.all) expect(await stateOf(x.node)).toBe('online');
    expect(await mailOf(s.people())).toHaveLength(1);
  });
});
