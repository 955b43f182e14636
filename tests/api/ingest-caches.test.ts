// What ingest caches (token lookups, thresholds, radio inventory) follows edits: at once on the
// instance that made them, within INGEST_CACHE_MS on every other (simulated here by editing the
// database directly, as another app process would, without this process hearing of it).
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Node } from '../../server/models';
import { hearChangeNotices, type ChangeNotices } from '../../server/services/ingestCaches';
import { buildUser, call, ingestTokenFor, postReports, signIn, useApi, type TestContext } from '../helpers/api';
import { manualClock } from '../helpers/clock';
import { buildNode, buildRadio } from '../helpers/factories';

const CACHE_MS = 400;
// The promise to users: a revoked token (or an edit) takes effect on every instance within 5 s.
const REVOKE_BOUND_MS = 5000;
const clock = manualClock();
const report = (seq: number, extra: object = {}) => ({ seq, sentAt: '2026-06-01T12:00:00Z', ...extra });

/** Posts reports (seq counting up) until the answer is `status`; how long that took, or null after `limitMs`. */
async function untilAnswer(ctx: TestContext, token: string, status: number, firstSeq: number, body: (seq: number) => object, limitMs: number) {
  const started = Date.now();
  for (let seq = firstSeq; Date.now() - started < limitMs; seq++) {
    if ((await postReports(ctx, token, body(seq))).status === status) return Date.now() - started;
    await new Promise((r) => setTimeout(r, 50));
  }
  return null;
}

describe('ingest caches', () => {
  const ctx = useApi({ now: clock.now, ingestCacheMs: CACHE_MS });

  it('stops a cached token at once when it is revoked through this instance', async () => {
    const node = await buildNode();
    const token = await ingestTokenFor(ctx, node.id);
    expect((await postReports(ctx, token, report(1))).status).toBe(202);
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    expect((await call(admin, 'delete', `/api/v1/nodes/${node.id}/ingest-token`)).status).toBe(204);
    const refused = await postReports(ctx, token, report(2));
    expect(refused.status).toBe(401);
    expect(refused.body.error.code).toBe('bad_token');
  });

  it('stops a cached token revoked by another instance within the cache lifetime', async () => {
    const node = await buildNode();
    const token = await ingestTokenFor(ctx, node.id);
    expect((await postReports(ctx, token, report(1))).status).toBe(202);
    await ctx.sequelize.query('UPDATE node_tokens SET revoked_at = now() WHERE node_id = $1', { bind: [node.id] });
    const tookMs = await untilAnswer(ctx, token, 401, 2, (seq) => report(seq), 2 * REVOKE_BOUND_MS);
    expect(tookMs).not.toBeNull();
    expect(tookMs!).toBeLessThanOrEqual(REVOKE_BOUND_MS);
  });

  it('judges the next report by a node’s new thresholds at once, and by new network thresholds within the cache lifetime', async () => {
    const node = await buildNode();
    const token = await ingestTokenFor(ctx, node.id);
    const weakish = (seq: number) => report(seq, { radios: [{ iface: 'wlan0', signalDbm: -70, noiseDbm: -100 }] });
    expect((await postReports(ctx, token, weakish(1))).status).toBe(202);
    expect((await Node.findByPk(node.id))!.state).toBe('online');
    // Through the model (as the app edits nodes): the hook forgets the cached token lookup.
    await Node.update({ thresholds: { minSignalDbm: -65, consecutiveReports: 1 } }, { where: { id: node.id } });
    expect((await postReports(ctx, token, weakish(2))).status).toBe(202);
    const degraded = (await Node.findByPk(node.id))!;
    expect(degraded.state).toBe('degraded');
    expect(degraded.healthReason).toContain('signal -70 dBm below -65 dBm');

    const other = await buildNode();
    const otherToken = await ingestTokenFor(ctx, other.id);
    expect((await postReports(ctx, otherToken, weakish(1))).status).toBe(202);
    expect((await Node.findByPk(other.id))!.state).toBe('online');
    await ctx.sequelize.query(`UPDATE network_settings SET thresholds = '{"minSignalDbm": -65, "consecutiveReports": 1}' WHERE id = 1`);
    const started = Date.now();
    let seq = 2;
    while ((await Node.findByPk(other.id))!.state !== 'degraded' && Date.now() - started < 2 * REVOKE_BOUND_MS) {
      expect((await postReports(ctx, otherToken, weakish(seq++))).status).toBe(202);
      await new Promise((r) => setTimeout(r, 50));
    }
    expect((await Node.findByPk(other.id))!.state).toBe('degraded');
    expect(Date.now() - started).toBeLessThanOrEqual(REVOKE_BOUND_MS);
    await ctx.sequelize.query(`UPDATE network_settings SET thresholds = '{}' WHERE id = 1`);
  });

  it('compares the next report with a radio edited through the API at once (drift), and with one edited elsewhere soon after', async () => {
    const node = await buildNode();
    const radio = await buildRadio({ nodeId: node.id, iface: 'wlan0' }); // inventory: channel 36, 40 MHz
    const token = await ingestTokenFor(ctx, node.id);
    const on44 = (seq: number) => report(seq, { radios: [{ iface: 'wlan0', channel: 44, channelWidthMHz: 40 }] });
    const driftOf = async () => (await Node.findByPk(node.id))!.drift;
    expect((await postReports(ctx, token, on44(1))).status).toBe(202);
    expect(await driftOf()).toEqual([{ field: 'wlan0.channel', expected: 36, reported: 44 }]);
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    expect((await call(admin, 'patch', `/api/v1/radios/${radio.id}`, { channel: 44 })).status).toBe(200);
    expect((await postReports(ctx, token, on44(2))).status).toBe(202);
    expect(await driftOf()).toEqual([]);

    await ctx.sequelize.query('UPDATE radios SET channel = 48 WHERE id = $1', { bind: [radio.id] });
    const started = Date.now();
    let seq = 3;
    while ((await driftOf())?.length === 0 && Date.now() - started < 2 * REVOKE_BOUND_MS) {
      expect((await postReports(ctx, token, on44(seq++))).status).toBe(202);
      await new Promise((r) => setTimeout(r, 50));
    }
    expect(await driftOf()).toEqual([{ field: 'wlan0.channel', expected: 48, reported: 44 }]);
    expect(Date.now() - started).toBeLessThanOrEqual(REVOKE_BOUND_MS);
  });

  it('judges a report again from how the node is when another instance moved it meanwhile, without a locked transaction', async () => {
    const node = await buildNode();
    const token = await ingestTokenFor(ctx, node.id);
    expect((await postReports(ctx, token, report(1))).status).toBe(202);
    // Another instance stored report 5 of the same boot: this process still remembers seq 1.
    await ctx.sequelize.query('UPDATE nodes SET last_seq = 5 WHERE id = $1', { bind: [node.id] });
    let locked = 0;
    ctx.sequelize.addHook('beforeQuery', 'count-locks', (_options, query) => {
      if ((query as unknown as { sql?: string }).sql?.includes('FOR UPDATE')) locked++;
    });
    try {
      expect((await postReports(ctx, token, report(6))).body).toEqual({ accepted: 1, duplicates: 0 });
      expect((await Node.findByPk(node.id))!.lastSeq).toBe('6');
      // A late report (seq 3 < 6) is kept but moves nothing.
      expect((await postReports(ctx, token, report(3))).body).toEqual({ accepted: 1, duplicates: 0 });
      expect((await Node.findByPk(node.id))!.lastSeq).toBe('6');
    } finally {
      ctx.sequelize.removeHook('beforeQuery', 'count-locks');
    }
    expect(locked).toBe(0);
  });

  it('keeps every report of concurrent requests and moves each node to its newest one', async () => {
    const nodes = await Promise.all([buildNode(), buildNode(), buildNode()]);
    const tokens = await Promise.all(nodes.map((n) => ingestTokenFor(ctx, n.id)));
    // 3 nodes × 20 reports at once, one node's reports racing each other: the group commit shares statements.
    await Promise.all(tokens.flatMap((t) => Array.from({ length: 20 }, (_, i) => postReports(ctx, t, report(i + 1)).then((r) => expect(r.status).toBe(202)))));
    const rows = await ctx.sequelize.query<{ node_id: number; n: string; last_seq: string }>(
      `SELECT h.node_id, count(*) AS n, n.last_seq::text AS last_seq FROM heartbeats h JOIN nodes n ON n.id = h.node_id
        WHERE h.node_id = ANY($1::int[]) GROUP BY h.node_id, n.last_seq ORDER BY h.node_id`,
      { bind: [nodes.map((n) => n.id)], type: QueryTypes.SELECT },
    );
    expect(rows.map((r) => [Number(r.n), r.last_seq])).toEqual([
      [20, '20'],
      [20, '20'],
      [20, '20'],
    ]);
  });
});

describe('ingest caches while the database’s change notices are heard', () => {
  const ctx = useApi({ now: clock.now, ingestCacheMs: CACHE_MS });
  let notices: ChangeNotices;
  let tokenLookups = 0;
  beforeAll(async () => {
    notices = hearChangeNotices(ctx.config.databaseUrl, 200);
    for (let waited = 0; !notices.hearing() && waited < 5000; waited += 50) await new Promise((r) => setTimeout(r, 50));
    ctx.sequelize.addHook('beforeQuery', 'count-token-lookups', (_options, query) => {
      if ((query as unknown as { sql?: string }).sql?.includes('FROM node_tokens t JOIN nodes n')) tokenLookups++;
    });
  });
  afterAll(async () => {
    ctx.sequelize.removeHook('beforeQuery', 'count-token-lookups');
    await notices.stop();
  });

  it('keeps a token lookup past the short lifetime while nothing changes', async () => {
    expect(notices.hearing()).toBe(true);
    const node = await buildNode();
    const token = await ingestTokenFor(ctx, node.id);
    expect((await postReports(ctx, token, report(1))).status).toBe(202);
    const before = tokenLookups;
    await new Promise((r) => setTimeout(r, 3 * CACHE_MS));
    expect((await postReports(ctx, token, report(2))).status).toBe(202);
    expect(tokenLookups).toBe(before);
  });

  it('stops a cached token revoked straight in the database as soon as the change commits', async () => {
    const node = await buildNode();
    const token = await ingestTokenFor(ctx, node.id);
    expect((await postReports(ctx, token, report(1))).status).toBe(202);
    await ctx.sequelize.query('UPDATE node_tokens SET revoked_at = now() WHERE node_id = $1', { bind: [node.id] });
    // The notice travels on its own connection: well within a second, not the cache lifetime.
    const tookMs = await untilAnswer(ctx, token, 401, 2, (seq) => report(seq), REVOKE_BOUND_MS);
    expect(tookMs).not.toBeNull();
    expect(tookMs!).toBeLessThan(1000);
  });

  it('compares the next report with a radio edited straight in the database, and judges by new network thresholds', async () => {
    const node = await buildNode();
    const radio = await buildRadio({ nodeId: node.id, iface: 'wlan0' }); // inventory: channel 36, 40 MHz
    const token = await ingestTokenFor(ctx, node.id);
    const on44 = (seq: number) => report(seq, { radios: [{ iface: 'wlan0', channel: 44, channelWidthMHz: 40, signalDbm: -70, noiseDbm: -100 }] });
    expect((await postReports(ctx, token, on44(1))).status).toBe(202);
    await ctx.sequelize.query('UPDATE radios SET channel = 44 WHERE id = $1', { bind: [radio.id] });
    await ctx.sequelize.query(`UPDATE network_settings SET thresholds = '{"minSignalDbm": -65, "consecutiveReports": 1}' WHERE id = 1`);
    try {
      await new Promise((r) => setTimeout(r, 300));
      expect((await postReports(ctx, token, on44(2))).status).toBe(202);
      const after = (await Node.findByPk(node.id))!;
      expect(after.drift).toEqual([]);
      expect(after.state).toBe('degraded');
    } finally {
      await ctx.sequelize.query(`UPDATE network_settings SET thresholds = '{}' WHERE id = 1`);
    }
  });
});
