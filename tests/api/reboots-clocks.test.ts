import { QueryTypes } from 'sequelize';
import { describe, expect, it } from 'vitest';
import { runSilenceCheck } from '../../server/jobs/silenceCheck';
import { Node } from '../../server/models';
import { buildUser, call, signIn, useApi, type TestContext, ingestTokenFor, postReports } from '../helpers/api';
import { manualClock } from '../helpers/clock';
import { buildNode } from '../helpers/factories';

const clock = manualClock('2026-06-01T12:00:00Z');
const BOOT_A = '0f6c2d4e-1a2b-4c3d-8e9f-a1b2c3d4e5f6';
const BOOT_B = '7d1e9a30-5b6c-4d7e-9f80-112233445566';
const report = (seq: number, extra: object = {}) => ({ seq, sentAt: '2026-06-01T12:00:00Z', ...extra });

const tokenFor = ingestTokenFor;
const post = postReports;
const seqRows = (ctx: TestContext, nodeId: number) =>
  ctx.sequelize.query<{ boot_id: string; seq: string }>(
    "SELECT coalesce(boot_id, '') AS boot_id, seq::text FROM heartbeats WHERE node_id = $1 ORDER BY received_at, boot_id, seq",
    { bind: [nodeId], type: QueryTypes.SELECT },
  );

describe('reports across reboots (bootId, seq)', () => {
  const ctx = useApi({ now: clock.now });

  it('accepts a rebooted router counting from 1 again, and its reports move its state', async () => {
    clock.set('2026-06-01T12:00:00Z');
    await runSilenceCheck(ctx.sequelize, ctx.config, clock.now(), 1000);
    const node = await buildNode();
    await Node.update({ reportIntervalS: 60 }, { where: { id: node.id } });
    const token = await tokenFor(ctx, node.id);
    expect((await post(ctx, token, report(41, { bootId: BOOT_A }))).body).toEqual({ accepted: 1, duplicates: 0 });
    // Silent for three intervals: offline.
    clock.advance(1);
    await runSilenceCheck(ctx.sequelize, ctx.config, clock.now(), 1000);
    clock.advance(181);
    await runSilenceCheck(ctx.sequelize, ctx.config, clock.now(), 1_000_000);
    expect((await Node.findByPk(node.id))!.state).toBe('offline');

    // The router reboots: new boot id, counter back at 1 (lower than 41, and seq 1 was never sent by boot A).
    clock.advance(30);
    const res = await post(ctx, token, report(1, { bootId: BOOT_B, sentAt: clock.now().toISOString() }));
    expect(res.status).toBe(202);
    expect(res.body).toEqual({ accepted: 1, duplicates: 0 });
    const after = (await Node.findByPk(node.id))!;
    expect(after.state).toBe('online');
    expect(after.lastSeq).toBe('1');
    expect((after.lastReport as { bootId: string }).bootId).toBe(BOOT_B);

    // The same seq from the same boot is a duplicate; from the old boot it is new but moves nothing.
    expect((await post(ctx, token, report(1, { bootId: BOOT_B }))).body).toEqual({ accepted: 0, duplicates: 1 });
    expect((await post(ctx, token, report(42, { bootId: BOOT_A }))).body).toEqual({ accepted: 1, duplicates: 0 });
    expect((await Node.findByPk(node.id))!.lastSeq).toBe('1');
    expect((await post(ctx, token, report(2, { bootId: BOOT_B }))).body).toEqual({ accepted: 1, duplicates: 0 });
    expect((await Node.findByPk(node.id))!.lastSeq).toBe('2');
    expect((await seqRows(ctx, node.id)).map((r) => `${r.boot_id.slice(0, 4)}:${r.seq}`).sort()).toEqual(['0f6c:41', '0f6c:42', '7d1e:1', '7d1e:2']);
  });

  it('is no longer stuck after a report with seq 2^53 - 1: the next boot moves it again', async () => {
    const node = await buildNode();
    const token = await tokenFor(ctx, node.id);
    expect((await post(ctx, token, report(2 ** 53 - 1, { bootId: BOOT_A }))).status).toBe(202);
    expect((await Node.findByPk(node.id))!.lastSeq).toBe(String(2 ** 53 - 1));
    const weak = { radios: [{ iface: 'wlan0', signalDbm: -70 }] };
    expect((await post(ctx, token, report(1, { bootId: BOOT_B, ...weak }))).status).toBe(202);
    const after = (await Node.findByPk(node.id))!;
    expect(after.lastSeq).toBe('1');
    expect((after.lastReport as { signalDbm: number }).signalDbm).toBe(-70);
  });

  it('keeps (node, seq) as the identity of reports without a boot id', async () => {
    const node = await buildNode();
    const token = await tokenFor(ctx, node.id);
    expect((await post(ctx, token, { reports: [report(5), report(6)] })).body).toEqual({ accepted: 2, duplicates: 0 });
    expect((await post(ctx, token, report(5))).body).toEqual({ accepted: 0, duplicates: 1 });
    expect((await post(ctx, token, report(3))).body).toEqual({ accepted: 1, duplicates: 0 });
    expect((await Node.findByPk(node.id))!.lastSeq).toBe('6');
  });

  it('takes a batch spanning a reboot whole, and the new boot speaks for the node', async () => {
    const node = await buildNode();
    const token = await tokenFor(ctx, node.id);
    const res = await post(ctx, token, { reports: [report(7, { bootId: BOOT_A }), report(8, { bootId: BOOT_A }), report(1, { bootId: BOOT_B })] });
    expect(res.body).toEqual({ accepted: 3, duplicates: 0 });
    expect((await Node.findByPk(node.id))!.lastSeq).toBe('1');
  });

  // The store function skips the duplicate probe for reports above the node's watermark (nodes.stored_seq
  // for nodes.stored_boot_id). These are the ways a report gets stored above it without moving the node.
  it('finds a resent report that was stored above the watermark by a batch that moved nothing', async () => {
    const node = await buildNode();
    const token = await tokenFor(ctx, node.id);
    expect((await post(ctx, token, report(10, { bootId: BOOT_A }))).body).toEqual({ accepted: 1, duplicates: 0 });
    expect((await post(ctx, token, report(1, { bootId: BOOT_B }))).body).toEqual({ accepted: 1, duplicates: 0 });
    // Boot B speaks now (seq 1). A batch ending in the older boot A moves nothing, but stores B's seq 30.
    const odd = await post(ctx, token, { reports: [report(30, { bootId: BOOT_B }), report(11, { bootId: BOOT_A })] });
    expect(odd.body).toEqual({ accepted: 2, duplicates: 0 });
    expect((await Node.findByPk(node.id))!.lastSeq).toBe('1');
    // Resending B's seq 30 is a duplicate even though it is above what the node last said; seq 29 is new.
    expect((await post(ctx, token, report(30, { bootId: BOOT_B }))).body).toEqual({ accepted: 0, duplicates: 1 });
    expect((await post(ctx, token, report(29, { bootId: BOOT_B }))).body).toEqual({ accepted: 1, duplicates: 0 });
    expect((await post(ctx, token, { reports: [report(29, { bootId: BOOT_B }), report(31, { bootId: BOOT_B })] })).body).toEqual({
      accepted: 1,
      duplicates: 1,
    });
    const rows = await seqRows(ctx, node.id);
    expect(rows.map((r) => `${r.boot_id.slice(0, 4)}:${r.seq}`).sort()).toEqual(['0f6c:10', '0f6c:11', '7d1e:1', '7d1e:29', '7d1e:30', '7d1e:31']);
  });

  it('finds duplicates of reports stored before the watermark was known, and after a move back to reports without a boot id', async () => {
    const node = await buildNode();
    const token = await tokenFor(ctx, node.id);
    expect((await post(ctx, token, { reports: [report(5, { bootId: BOOT_A }), report(6, { bootId: BOOT_A })] })).body).toEqual({ accepted: 2, duplicates: 0 });
    // As a node row that predates the watermark (or whose watermark was lost) looks: unknown.
    await ctx.sequelize.query('UPDATE nodes SET stored_boot_id = NULL, stored_seq = NULL WHERE id = $1', { bind: [node.id] });
    expect((await post(ctx, token, { reports: [report(6, { bootId: BOOT_A }), report(7, { bootId: BOOT_A })] })).body).toEqual({ accepted: 1, duplicates: 1 });
    // Reports without a boot id are their own series: seq 7 of "no boot" is new, then a duplicate.
    expect((await post(ctx, token, report(7))).body).toEqual({ accepted: 1, duplicates: 0 });
    expect((await post(ctx, token, report(7))).body).toEqual({ accepted: 0, duplicates: 1 });
    expect((await post(ctx, token, report(6, { bootId: BOOT_A }))).body).toEqual({ accepted: 0, duplicates: 1 });
    const [wm] = await ctx.sequelize.query<{ stored_boot_id: string | null; stored_seq: string | null }>(
      'SELECT stored_boot_id, stored_seq::text FROM nodes WHERE id = $1',
      { bind: [node.id], type: QueryTypes.SELECT },
    );
    expect(wm).not.toEqual({ stored_boot_id: null, stored_seq: null });
    expect((await seqRows(ctx, node.id)).length).toBe(4);
  });

  it('refuses a malformed boot id with 400 naming the field', async () => {
    const node = await buildNode();
    const token = await tokenFor(ctx, node.id);
    const res = await post(ctx, token, { reports: [report(1), report(2, { bootId: 'x'.repeat(65) })] });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].path).toBe('reports.1.bootId');
    expect((await post(ctx, token, report(3, { bootId: "'; DROP TABLE nodes; --" }))).status).toBe(400);
  });
});

describe('a node whose clock is plainly wrong', () => {
  const ctx = useApi({ now: clock.now });

  it.each([
    ['0000-01-01T00:00:00Z', 'too-early'],
    ['1970-01-01T00:00:00Z', 'too-early'],
    ['2019-12-31T23:59:59Z', 'too-early'],
    ['9999-12-31T23:59:59Z', 'ahead'],
    ['2026-06-02T12:00:01Z', 'ahead'], // a day and a second ahead of the server
  ])('accepts sentAt %s, stores it as unknown and shows clock trouble (%s)', async (sentAt, kind) => {
    clock.set('2026-06-01T12:00:00Z');
    const node = await buildNode();
    const token = await tokenFor(ctx, node.id);
    const res = await post(ctx, token, report(1, { sentAt }));
    expect(res.status).toBe(202);
    expect(res.body).toEqual({ accepted: 1, duplicates: 0 });
    const [row] = await ctx.sequelize.query<{ sent_at: Date | null }>('SELECT sent_at FROM heartbeats WHERE node_id = $1', {
      bind: [node.id],
      type: QueryTypes.SELECT,
    });
    expect(row.sent_at).toBeNull();
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    const shown = await call(admin, 'get', `/api/v1/nodes/${node.id}`);
    expect(shown.body.data.lastReport.clockTrouble).toEqual({ kind, reportedSentAt: sentAt });
    expect(shown.body.data.lastReport.sentAt).toBeNull();
    expect(shown.body.data.state).toBe('online');
  });

  it('keeps a plausible clock as sent, without trouble (a day ahead exactly is still plausible)', async () => {
    clock.set('2026-06-01T12:00:00Z');
    const node = await buildNode();
    const token = await tokenFor(ctx, node.id);
    expect((await post(ctx, token, report(1, { sentAt: '2026-06-02T12:00:00Z' }))).status).toBe(202);
    expect((await post(ctx, token, report(2, { sentAt: '2026-06-01T13:30:00+01:30' }))).status).toBe(202);
    const rows = await ctx.sequelize.query<{ sent_at: Date }>('SELECT sent_at FROM heartbeats WHERE node_id = $1 ORDER BY seq', {
      bind: [node.id],
      type: QueryTypes.SELECT,
    });
    expect(rows.map((r) => new Date(r.sent_at).toISOString())).toEqual(['2026-06-02T12:00:00.000Z', '2026-06-01T12:00:00.000Z']);
    expect(((await Node.findByPk(node.id))!.lastReport as { clockTrouble: unknown }).clockTrouble).toBeNull();
  });

  it('does not refuse a batch because one report has an absurd clock', async () => {
    const node = await buildNode();
    const token = await tokenFor(ctx, node.id);
    const res = await post(ctx, token, { reports: [report(1), report(2, { sentAt: '0000-01-01T00:00:00Z' }), report(3)] });
    expect(res.status).toBe(202);
    expect(res.body).toEqual({ accepted: 3, duplicates: 0 });
  });
});

describe('inputs that used to reach PostgreSQL unchecked', () => {
  const ctx = useApi({ now: clock.now });

  it.each([
    '/api/v1/links/2147483648/health',
    '/api/v1/nodes/2147483648',
    '/api/v1/nodes/99999999999999999999999',
    '/api/v1/sites/2147483648',
    '/api/v1/neighbourhoods/2147483648/summary',
    '/api/v1/radios/9007199254740993',
    '/api/v1/outages/2147483648',
    '/api/v1/users/2147483648',
    '/api/v1/nodes/2147483648/series',
  ])('GET %s is 404, never 500', async (url) => {
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    const res = await call(admin, 'get', url);
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('answers 400 for an id beyond the integer range in a body or a filter', async () => {
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    const created = await call(admin, 'post', '/api/v1/nodes', { name: 'far-away', siteId: 2147483648 });
    expect(created.status).toBe(400);
    expect(created.body.error.details[0]).toEqual({ path: 'siteId', message: 'siteId must be at most 2147483647; no record has a larger id' });
    const listed = await call(admin, 'get', '/api/v1/nodes?neighbourhoodId=2147483648');
    expect(listed.status).toBe(400);
  });

  it('answers 400, not 500, for a NUL byte in a search', async () => {
    const admin = await signIn(ctx, await buildUser({ role: 'admin' }));
    const res = await call(admin, 'get', '/api/v1/nodes?q=a%00b');
    expect([200, 400]).toContain(res.status);
  });
});
