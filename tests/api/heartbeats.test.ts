import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { beforeEach, describe, expect, it } from 'vitest';
import { Node, Site } from '../../server/models';
import { runSilenceCheck } from '../../server/jobs/silenceCheck';
import { buildUser, call, signIn, useApi, type TestContext, ingestTokenFor, postReports } from '../helpers/api';
import { manualClock } from '../helpers/clock';
import { buildNeighbourhood, buildNode, buildRadio } from '../helpers/factories';

const clock = manualClock();
const report = (seq: number, extra: object = {}) => ({ seq, sentAt: '2026-06-01T12:00:00Z', ...extra });

const tokenFor = ingestTokenFor;
const post = postReports;

async function stored(ctx: TestContext, nodeId: number) {
  // One row per report; its radios are a jsonb array on that row, and the row itself is the duplicate guard.
  const [row] = await ctx.sequelize.query<{ hb: string; radios: string; seqs: string }>(
    `SELECT (SELECT count(*) FROM heartbeats WHERE node_id = $1) AS hb, (SELECT count(*) FROM heartbeat_radio_rows WHERE node_id = $1) AS radios,
            (SELECT count(DISTINCT (coalesce(boot_id, ''), seq)) FROM heartbeats WHERE node_id = $1) AS seqs`,
    { bind: [nodeId], type: QueryTypes.SELECT },
  );
  return { heartbeats: Number(row.hb), radios: Number(row.radios), seqs: Number(row.seqs) };
}

describe('node ingest tokens', () => {
  const ctx = useApi({ now: clock.now });

  it('issues a 256-bit token once, stores only its hash, and rotation stops the old one', async () => {
    const node = await buildNode();
    const first = await tokenFor(ctx, node.id);
    expect(first).toMatch(/^ppt_\d+_[A-Za-z0-9_-]{43}$/);
    const [row] = await ctx.sequelize.query<{ token_hash: string }>('SELECT token_hash FROM node_tokens WHERE node_id = $1', {
      bind: [node.id],
      type: QueryTypes.SELECT,
    });
    expect(row.token_hash).toMatch(/^[0-9a-f]{64}$/);
    expect(row.token_hash).not.toContain(first.slice(-43));
    expect((await post(ctx, first, report(1))).status).toBe(202);
    const second = await tokenFor(ctx, node.id);
    const old = await post(ctx, first, report(2));
    expect(old.status).toBe(401);
    expect(old.body.error.code).toBe('bad_token');
    expect((await post(ctx, second, report(2))).status).toBe(202);
  });

  it('refuses a revoked token with 401 and stores nothing', async () => {
    const node = await buildNode();
    const token = await tokenFor(ctx, node.id);
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    expect((await call(admin, 'delete', `/api/v1/nodes/${node.id}/ingest-token`)).status).toBe(204);
    expect((await post(ctx, token, report(1))).status).toBe(401);
    expect(await stored(ctx, node.id)).toEqual({ heartbeats: 0, radios: 0, seqs: 0 });
  });

  it('refuses missing and made-up tokens with 401', async () => {
    expect((await request(ctx.app).post('/api/v1/heartbeats').send(report(1))).status).toBe(401);
    expect((await post(ctx, 'ppt_1_' + 'A'.repeat(43), report(1))).status).toBe(401);
    expect((await post(ctx, 'garbage', report(1))).status).toBe(401);
  });

  it('lets only admins and the node’s operators issue tokens (others: 403 or 404)', async () => {
    const opA = await buildUser({ role: 'operator' });
    const opB = await buildUser({ role: 'operator' });
    const host = await buildUser({ role: 'host' });
    const hood = await buildNeighbourhood({ operators: [opA] });
    await buildNeighbourhood({ operators: [opB] });
    const node = await buildNode({ neighbourhoodId: hood.id });
    await Site.update({ hostUserId: host.id }, { where: { id: node.siteId } });
    expect((await call(await signIn(ctx, opA), 'post', `/api/v1/nodes/${node.id}/ingest-token`)).status).toBe(201);
    expect((await call(await signIn(ctx, opB), 'post', `/api/v1/nodes/${node.id}/ingest-token`)).status).toBe(404);
    expect((await call(await signIn(ctx, host), 'post', `/api/v1/nodes/${node.id}/ingest-token`)).status).toBe(403);
    expect((await request(ctx.app).post(`/api/v1/nodes/${node.id}/ingest-token`)).status).toBe(401);
  });
});

describe('heartbeat ingest', () => {
  const ctx = useApi({ now: clock.now });
  let node: Node;
  let token: string;
  beforeEach(async () => {
    node = await buildNode();
    token = await tokenFor(ctx, node.id);
  });

  const bad: [string, unknown, string][] = [
    ['no seq', { sentAt: '2026-06-01T12:00:00Z' }, 'seq'],
    ['seq as text', report(0, { seq: 'one' }), 'seq'],
    ['negative seq', report(-1), 'seq'],
    ['fractional seq', report(1.5), 'seq'],
    ['seq beyond 2^53', report(2 ** 53 + 2), 'seq'],
    ['no sentAt', { seq: 1 }, 'sentAt'],
    ['sentAt not a time', report(1, { sentAt: 'yesterday' }), 'sentAt'],
    ['negative uptime', report(1, { uptimeS: -5 }), 'uptimeS'],
    ['uptime as text', report(1, { uptimeS: '100' }), 'uptimeS'],
    ['negative load', report(1, { load1: -0.1 }), 'load1'],
    ['negative throughput', report(1, { throughputMbps: -3 }), 'throughputMbps'],
    ['latency as null-ish string', report(1, { latencyMs: 'NaN' }), 'latencyMs'],
    ['radios not a list', report(1, { radios: {} }), 'radios'],
    ['nine radios', report(1, { radios: Array.from({ length: 9 }, (_, i) => ({ iface: `wlan${i}` })) }), 'radios'],
    ['radio without iface', report(1, { radios: [{ signalDbm: -60 }] }), 'radios.0.iface'],
    ['iface with a space', report(1, { radios: [{ iface: 'wlan 0' }] }), 'radios.0.iface'],
    ['signal above 0 dBm', report(1, { radios: [{ iface: 'wlan0', signalDbm: 5 }] }), 'radios.0.signalDbm'],
    ['signal below -120 dBm', report(1, { radios: [{ iface: 'wlan0', signalDbm: -121 }] }), 'radios.0.signalDbm'],
    ['noise above 0 dBm', report(1, { radios: [{ iface: 'wlan0', noiseDbm: 1 }] }), 'radios.0.noiseDbm'],
    ['unknown band', report(1, { radios: [{ iface: 'wlan0', band: '6' }] }), 'radios.0.band'],
    ['odd channel width', report(1, { radios: [{ iface: 'wlan0', channelWidthMHz: 30 }] }), 'radios.0.channelWidthMHz'],
    ['negative clients', report(1, { radios: [{ iface: 'wlan0', clients: -1 }] }), 'radios.0.clients'],
    ['malformed peer MAC', report(1, { radios: [{ iface: 'wlan0', peerMac: 'zz:00' }] }), 'radios.0.peerMac'],
    ['empty batch', { reports: [] }, 'reports'],
    ['one bad report in a batch', { reports: [report(1), report(2), report(3), report(4, { uptimeS: -1 })] }, 'reports.3.uptimeS'],
    ['batch of 501', { reports: Array.from({ length: 501 }, (_, i) => report(i)) }, 'reports'],
  ];

  it.each(bad)('rejects %s with 400, the field path, and stores nothing', async (_name, body, path) => {
    const res = await post(ctx, token, body);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
    expect(res.body.error.details.map((d: { path: string }) => d.path)).toContain(path);
    expect(await stored(ctx, node.id)).toEqual({ heartbeats: 0, radios: 0, seqs: 0 });
  });

  it('rejects Infinity smuggled as a huge number and a non-JSON body with 400', async () => {
    const huge = await request(ctx.app)
      .post('/api/v1/heartbeats')
      .set('Authorization', `Bearer ${token}`)
      .set('content-type', 'application/json')
      .send('{"seq":1,"sentAt":"2026-06-01T12:00:00Z","uptimeS":1e400}');
    expect(huge.status).toBe(400);
    const notJson = await request(ctx.app)
      .post('/api/v1/heartbeats')
      .set('Authorization', `Bearer ${token}`)
      .set('content-type', 'application/json')
      .send('{"seq":');
    expect(notJson.status).toBe(400);
    expect(await stored(ctx, node.id)).toEqual({ heartbeats: 0, radios: 0, seqs: 0 });
  });

  it('answers 413 for a body over 64 KiB and stores nothing', async () => {
    const res = await post(ctx, token, report(1, { firmware: 'x'.repeat(70 * 1024) }));
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too_large');
    expect(await stored(ctx, node.id)).toEqual({ heartbeats: 0, radios: 0, seqs: 0 });
  });

  it('stores one report with its radios and answers 202 with counts', async () => {
    const res = await post(
      ctx,
      token,
      report(1, {
        uptimeS: 3600,
        radios: [
          { iface: 'wlan0', signalDbm: -62, noiseDbm: -95 },
          { iface: 'wlan1', clients: 4 },
        ],
      }),
    );
    expect(res.status).toBe(202);
    expect(res.body).toEqual({ accepted: 1, duplicates: 0 });
    expect(await stored(ctx, node.id)).toEqual({ heartbeats: 1, radios: 2, seqs: 1 });
    const [radio] = await ctx.sequelize.query<{ signal_dbm: number }>("SELECT signal_dbm FROM heartbeat_radio_rows WHERE node_id = $1 AND iface = 'wlan0'", {
      bind: [node.id],
      type: QueryTypes.SELECT,
    });
    expect(radio.signal_dbm).toBe(-62);
  });

  it('stores a repeated seq once, across requests and within a batch', async () => {
    expect((await post(ctx, token, report(7))).body).toEqual({ accepted: 1, duplicates: 0 });
    expect((await post(ctx, token, report(7))).body).toEqual({ accepted: 0, duplicates: 1 });
    expect((await post(ctx, token, { reports: [report(7), report(8), report(8)] })).body).toEqual({ accepted: 1, duplicates: 2 });
    expect((await stored(ctx, node.id)).heartbeats).toBe(2);
  });

  it('stores a buffered batch whole and takes the newest seq as the current state', async () => {
    const reports = Array.from({ length: 50 }, (_, i) => report(i + 1, { radios: [{ iface: 'wlan0', signalDbm: -60 - (i % 5) }] }));
    const res = await post(ctx, token, { reports: reports.reverse() });
    expect(res.body).toEqual({ accepted: 50, duplicates: 0 });
    const fresh = (await Node.findByPk(node.id))!;
    expect(fresh.lastSeq).toBe('50');
    expect(fresh.state).toBe('online');
  });

  it('keeps late, out-of-order reports without moving the current state backwards', async () => {
    await post(ctx, token, report(10, { radios: [{ iface: 'wlan0', signalDbm: -60 }] }));
    clock.advance(5);
    const late = await post(ctx, token, report(9, { radios: [{ iface: 'wlan0', signalDbm: -95 }] }));
    expect(late.body).toEqual({ accepted: 1, duplicates: 0 });
    const fresh = (await Node.findByPk(node.id))!;
    expect(fresh.lastSeq).toBe('10');
    expect((fresh.lastReport as { signalDbm: number }).signalDbm).toBe(-60);
    expect(fresh.state).toBe('online');
    expect(fresh.lastSeenAt!.getTime()).toBe(clock.now().getTime());
    expect((await stored(ctx, node.id)).heartbeats).toBe(2);
  });

  it('uses the server clock for receive time and stores a 1970 node clock as unknown (API.md: plainly wrong)', async () => {
    await post(ctx, token, report(1, { sentAt: '1970-01-01T00:00:42Z' }));
    const [row] = await ctx.sequelize.query<{ received_at: Date; sent_at: Date | null }>('SELECT received_at, sent_at FROM heartbeats WHERE node_id = $1', {
      bind: [node.id],
      type: QueryTypes.SELECT,
    });
    expect(row.sent_at).toBeNull();
    expect(new Date(row.received_at).getTime()).toBe(clock.now().getTime());
  });

  it('moves a node from unknown to online on its first report, and to degraded when weak', async () => {
    expect((await Node.findByPk(node.id))!.state).toBe('unknown');
    await post(ctx, token, report(1, { radios: [{ iface: 'wlan0', signalDbm: -60, noiseDbm: -95 }] }));
    expect((await Node.findByPk(node.id))!.state).toBe('online');
    const other = await buildNode();
    const otherToken = await tokenFor(ctx, other.id);
    await post(ctx, otherToken, report(1, { radios: [{ iface: 'wlan0', signalDbm: -88, noiseDbm: -95 }] }));
    const degraded = (await Node.findByPk(other.id))!;
    expect(degraded.state).toBe('degraded');
    expect(degraded.healthReason).toContain('signal -88 dBm below -80 dBm');
  });

  it('records each change that touches no outage once, with its reason, when reports arrive together', async () => {
    const n = await buildNode();
    const t = await tokenFor(ctx, n.id);
    const strong = { radios: [{ iface: 'wlan0', signalDbm: -60, noiseDbm: -95 }] };
    const weak = { radios: [{ iface: 'wlan0', signalDbm: -88, noiseDbm: -95 }] };
    const first = await Promise.all([1, 2, 3, 4].map((seq) => post(ctx, t, report(seq, strong))));
    expect(first.map((a) => a.status)).toEqual([202, 202, 202, 202]);
    for (let seq = 5; seq <= 9; seq++) expect((await post(ctx, t, report(seq, weak))).status).toBe(202);
    const moves = await ctx.sequelize.query<{ move: string; reason: string }>(
      "SELECT from_state || '>' || to_state AS move, reason FROM node_transitions WHERE node_id = $1 ORDER BY id",
      { bind: [n.id], type: QueryTypes.SELECT },
    );
    expect(moves.map((m) => m.move)).toEqual(['unknown>online', 'online>degraded']);
    expect(moves[1].reason).toContain('signal -88 dBm below -80 dBm');
    const after = (await Node.findByPk(n.id))!;
    expect(after.state).toBe('degraded');
    expect(after.stateSince).not.toBeNull();
  });

  it('flags reported settings that differ from the inventory as drift', async () => {
    await buildRadio({ nodeId: node.id, iface: 'wlan0' }); // inventory: channel 36, 40 MHz, ssid test-backhaul
    await Node.update({ firmware: 'Tilecrest 5.1.2' }, { where: { id: node.id } });
    const freshToken = await tokenFor(ctx, node.id);
    await post(
      ctx,
      freshToken,
      report(1, { firmware: 'Tilecrest 5.0.4', radios: [{ iface: 'wlan0', channel: 44, channelWidthMHz: 40, ssid: 'someone-else' }] }),
    );
    const res = await request(ctx.app).get(`/api/v1/nodes/${node.id}`);
    expect(res.status).toBe(401); // drift is shown to signed-in people only
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    const drift = (await admin.get(`/api/v1/nodes/${node.id}`)).body.data.drift;
    expect(drift).toEqual([
      { field: 'firmware', expected: 'Tilecrest 5.1.2', reported: 'Tilecrest 5.0.4' },
      { field: 'wlan0.channel', expected: 36, reported: 44 },
      { field: 'wlan0.ssid', expected: 'test-backhaul', reported: 'someone-else' },
    ]);
  });
});

describe('ingest rate limit per token', () => {
  const ctx = useApi({ now: clock.now, ingestRateLimitPerMin: 3 });

  it('limits one token with 429 and Retry-After while another node behind the same address goes on', async () => {
    const a = await buildNode();
    const b = await buildNode();
    const ta = await tokenFor(ctx, a.id);
    const tb = await tokenFor(ctx, b.id);
    for (let i = 1; i <= 3; i++) expect((await post(ctx, ta, report(i))).status).toBe(202);
    const limited = await post(ctx, ta, report(4));
    expect(limited.status).toBe(429);
    expect(Number(limited.headers['retry-after'])).toBeGreaterThan(0);
    expect((await post(ctx, tb, report(1))).status).toBe(202);
    expect((await stored(ctx, a.id)).heartbeats).toBe(3);
  });
});

describe('silence check and outages', () => {
  const ctx = useApi({ now: clock.now });
  const interval = 60;

  async function reportingNode() {
    const node = await buildNode();
    await Node.update({ reportIntervalS: interval }, { where: { id: node.id } });
    const token = await tokenFor(ctx, node.id);
    return { node, token };
  }

  it('marks a node offline after three missed intervals, opens an outage, and closes it on recovery', async () => {
    clock.set('2026-06-02T08:00:00Z');
    await runSilenceCheck(ctx.sequelize, ctx.config, clock.now(), 1000); // starts watching
    const { node, token } = await reportingNode();
    await post(ctx, token, report(1));
    clock.advance(1);
    await runSilenceCheck(ctx.sequelize, ctx.config, clock.now(), 1000);
    clock.advance(interval * 3 - 2);
    await runSilenceCheck(ctx.sequelize, ctx.config, clock.now(), 1_000_000);
    expect((await Node.findByPk(node.id))!.state).toBe('online');
    clock.advance(2);
    const run = await runSilenceCheck(ctx.sequelize, ctx.config, clock.now(), 1_000_000);
    expect(run.silenced).toBeGreaterThanOrEqual(1);
    expect((await Node.findByPk(node.id))!.state).toBe('offline');
    const [outage] = await ctx.sequelize.query<{ id: number; started_at: Date; ended_at: Date | null }>(
      'SELECT id, started_at, ended_at FROM outages WHERE node_id = $1',
      { bind: [node.id], type: QueryTypes.SELECT },
    );
    expect(outage.ended_at).toBeNull();
    expect(new Date(outage.started_at).toISOString()).toBe('2026-06-02T08:01:00.000Z'); // the first missed report

    clock.advance(600);
    await post(ctx, token, report(2));
    expect((await Node.findByPk(node.id))!.state).toBe('online');
    const [closed] = await ctx.sequelize.query<{ ended_at: Date }>('SELECT ended_at FROM outages WHERE id = $1', {
      bind: [outage.id],
      type: QueryTypes.SELECT,
    });
    expect(new Date(closed.ended_at).getTime()).toBe(clock.now().getTime());
    const transitions = await ctx.sequelize.query<{ from_state: string; to_state: string }>(
      'SELECT from_state, to_state FROM node_transitions WHERE node_id = $1 ORDER BY id',
      { bind: [node.id], type: QueryTypes.SELECT },
    );
    expect(transitions.map((t) => `${t.from_state}>${t.to_state}`)).toEqual(['unknown>online', 'online>offline', 'offline>online']);
  });

  it('after Parapet itself was down, waits one full window before declaring nodes offline', async () => {
    clock.set('2026-06-03T08:00:00Z');
    await runSilenceCheck(ctx.sequelize, ctx.config, clock.now(), 1000);
    const { node, token } = await reportingNode();
    await post(ctx, token, report(1));
    // Parapet is down for an hour: no checks run.
    clock.advance(3600);
    const first = await runSilenceCheck(ctx.sequelize, ctx.config, clock.now(), 1000);
    expect(first.resumed).toBe(true);
    expect((await Node.findByPk(node.id))!.state).toBe('online');
    clock.advance(interval * 3 - 1);
    await runSilenceCheck(ctx.sequelize, ctx.config, clock.now(), 1_000_000);
    expect((await Node.findByPk(node.id))!.state).toBe('online');
    clock.advance(1);
    await runSilenceCheck(ctx.sequelize, ctx.config, clock.now(), 1_000_000);
    expect((await Node.findByPk(node.id))!.state).toBe('offline');
  });

  it('runs the check in one process at a time (advisory lock)', async () => {
    const results = await Promise.all([1, 2, 3].map(() => runSilenceCheck(ctx.sequelize, ctx.config, clock.now(), 1_000_000)));
    expect(results.filter((r) => r.leader).length).toBeGreaterThanOrEqual(1);
    // Whoever ran, no node got two open outages (a unique index allows one).
    const [row] = await ctx.sequelize.query<{ n: string }>(
      'SELECT count(*) AS n FROM (SELECT node_id FROM outages WHERE ended_at IS NULL GROUP BY node_id HAVING count(*) > 1) x',
      { type: QueryTypes.SELECT },
    );
    expect(Number(row.n)).toBe(0);
  });
});
