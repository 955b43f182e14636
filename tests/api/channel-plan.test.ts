import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { Radio } from '../../server/models';
import { call, useApi } from '../helpers/api';
import { buildNode, buildRadio, buildSite } from '../helpers/factories';
import { planningCast, setNetwork } from '../helpers/planningActors';

const ap24 = (channel: number) => ({ band: '2.4' as const, channel, channelWidthMHz: 20, role: 'access-point' as const, txPowerDbm: 17, antennaGainDbi: 2 });

describe('channel plan API', () => {
  const ctx = useApi();

  it('answers 401 signed out and 403 to hosts', async () => {
    expect((await request(ctx.app).get('/api/v1/planning/channel-plan')).status).toBe(401);
    const { host } = await planningCast(ctx);
    const res = await call(host, 'get', '/api/v1/planning/channel-plan');
    expect(res.status).toBe(403);
    expect(res.body.error.message).toBe('Planning is for operators and admins.');
  });

  it('refuses a bad band filter (400)', async () => {
    const { op } = await planningCast(ctx);
    const res = await call(op, 'get', '/api/v1/planning/channel-plan?band=3');
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('band');
  });

  it('keeps one node’s 2.4 GHz radios on channels that do not overlap and avoids a loud surveyed channel', async () => {
    await setNetwork({ region: 'US' });
    const { op, node } = await planningCast(ctx);
    const a = await buildRadio({ nodeId: node.id, iface: 'wlan0' });
    const b = await buildRadio({ nodeId: node.id, iface: 'wlan1' });
    await Radio.update(ap24(1), { where: { id: [a.id, b.id] } });
    // A strong neighbour on channel 1 heard at this node.
    const csv = 'ssid,channel,channelWidthMHz,signalDbm\nLoud Cafe,1,20,-40\n';
    expect((await op.post(`/api/v1/nodes/${node.id}/site-surveys`).set('X-CSRF-Token', op.csrf).attach('file', Buffer.from(csv), 's.csv')).status).toBe(201);
    const res = await call(op, 'get', '/api/v1/planning/channel-plan?band=2.4');
    expect(res.status).toBe(200);
    const mine = res.body.data.radios.filter((r: { nodeId: number }) => r.nodeId === node.id);
    const channels = mine.map((r: { recommendedChannel: number }) => r.recommendedChannel);
    expect(channels).toHaveLength(2);
    // 1/6/11 are the US channels that do not overlap (common practice); 1 is congested here, so 6 and 11.
    expect([...channels].sort((x, y) => x - y)).toEqual([6, 11]);
    for (const c of channels) expect(c).toBeLessThanOrEqual(11); // US allows 1–11
    const congestion = res.body.data.congestion.find((c: { nodeId: number }) => c.nodeId === node.id);
    const ch1 = congestion['2.4'].find((x: { channel: number }) => x.channel === 1);
    expect(ch1.congestionDbm).toBeCloseTo(-40, 1); // the whole -40 dBm network falls on its own 20 MHz channel
    expect(ch1.networks).toBe(1);
  });

  it('applies a plan in one transaction and records each change; refuses others’ radios and disallowed channels', async () => {
    await setNetwork({ region: 'EU' });
    const { op, outsider, node, otherNode } = await planningCast(ctx);
    const mine = await buildRadio({ nodeId: node.id });
    await Radio.update(ap24(1), { where: { id: mine.id } });
    const theirs = await buildRadio({ nodeId: otherNode.id });

    const notReadable = await call(op, 'post', '/api/v1/planning/channel-plan/apply', {
      assignments: [
        { radioId: mine.id, channel: 6 },
        { radioId: theirs.id, channel: 44 },
      ],
    });
    expect(notReadable.status).toBe(404);
    expect((await Radio.findByPk(mine.id))!.channel).toBe(1); // nothing changed: one transaction

    const forbidden = await call(outsider, 'post', '/api/v1/planning/channel-plan/apply', { assignments: [{ radioId: mine.id, channel: 6 }] });
    expect(forbidden.status).toBe(404);

    const disallowed = await call(op, 'post', '/api/v1/planning/channel-plan/apply', { assignments: [{ radioId: mine.id, channel: 14 }] });
    expect(disallowed.status).toBe(400);
    expect(disallowed.body.error.details[0]).toEqual({
      path: 'assignments.0.channel',
      message: 'assignments.0.channel 14 is not allowed for this radio in EU',
    });

    const twice = await call(op, 'post', '/api/v1/planning/channel-plan/apply', {
      assignments: [
        { radioId: mine.id, channel: 6 },
        { radioId: mine.id, channel: 11 },
      ],
    });
    expect(twice.status).toBe(400);

    const ok = await call(op, 'post', '/api/v1/planning/channel-plan/apply', { assignments: [{ radioId: mine.id, channel: 13 }] });
    expect(ok.status).toBe(200);
    expect(ok.body.data).toEqual({ updated: 1, changes: [{ radioId: mine.id, before: { channel: 1 }, after: { channel: 13 } }] });
    expect((await Radio.findByPk(mine.id))!.channel).toBe(13);
    const history = await call(op, 'get', '/api/v1/planning/channel-plan/history');
    expect(history.body.data[0]).toMatchObject({ radioId: mine.id, before: { channel: 1 }, after: { channel: 13 } });
  });

  it('forbids an operator who may read but not manage the radio (403)', async () => {
    const { host, hood } = await planningCast(ctx);
    // An admin-only neighbourhood radio that an operator reads through hosting its site.
    const { User } = await import('../../server/models');
    await User.update({ role: 'operator' }, { where: { id: host.userId } });
    const site = await buildSite({ neighbourhoodId: hood.id, hostUserId: host.userId });
    const n = await buildNode({ siteId: site.id });
    const r = await buildRadio({ nodeId: n.id });
    const signedIn = await (await import('../helpers/api')).signIn(ctx, (await User.findByPk(host.userId))!);
    const res = await call(signedIn, 'post', '/api/v1/planning/channel-plan/apply', { assignments: [{ radioId: r.id, channel: 40 }] });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toBe(`Only admins and the operators of its neighbourhood change radio ${r.id}.`);
  });
});
