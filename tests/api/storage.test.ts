import { QueryTypes } from 'sequelize';
import { describe, expect, it } from 'vitest';
import { applyRetention, ensurePartitions, rollUp } from '../../server/jobs/heartbeatStorage';
import { ingestReports } from '../../server/services/heartbeatIngest';
import { nodeForToken, rotateToken } from '../../server/services/ingestTokens';
import { useApi } from '../helpers/api';
import { buildNode } from '../helpers/factories';

const partitionsOf = async (ctx: ReturnType<typeof useApi>, table: string) =>
  (
    await ctx.sequelize.query<{ name: string }>(
      `SELECT c.relname AS name FROM pg_inherits i JOIN pg_class c ON c.oid = i.inhrelid JOIN pg_class p ON p.oid = i.inhparent
       WHERE p.relname = $1 ORDER BY 1`,
      { bind: [table], type: QueryTypes.SELECT },
    )
  ).map((r) => r.name);

describe('heartbeat storage upkeep', () => {
  const ctx = useApi();

  it('creates daily partitions ahead for the raw reports, and reports land in their day’s partition', async () => {
    const now = new Date('2031-03-10T12:00:00Z');
    await ensurePartitions(ctx.sequelize, now, 3);
    const parts = await partitionsOf(ctx, 'heartbeats');
    expect(parts).toEqual(expect.arrayContaining(['heartbeats_p20310309', 'heartbeats_p20310310', 'heartbeats_p20310313']));
    const node = await buildNode();
    const token = await rotateToken(ctx.sequelize, node.id, now);
    const reports = [{ seq: 1, sentAt: now.toISOString(), radios: [{ iface: 'wlan0', signalDbm: -60 }] }];
    await ingestReports(ctx.sequelize, ctx.config, (await nodeForToken(ctx.sequelize, token))!, reports, now);
    const [row] = await ctx.sequelize.query<{ part: string }>(`SELECT tableoid::regclass::text AS part FROM heartbeats WHERE node_id = $1`, {
      bind: [node.id],
      type: QueryTypes.SELECT,
    });
    expect(row.part).toBe('heartbeats_p20310310');
    // Running it again changes nothing.
    await ensurePartitions(ctx.sequelize, now, 3);
    expect(await partitionsOf(ctx, 'heartbeats')).toEqual(parts);
  });

  it('rolls reports up into 5-minute and hourly buckets with min/avg/max and availability', async () => {
    const node = await buildNode();
    const start = new Date('2031-04-01T10:00:00Z');
    await ensurePartitions(ctx.sequelize, start, 1);
    const token = await rotateToken(ctx.sequelize, node.id, start);
    const tokenNode = (await nodeForToken(ctx.sequelize, token))!;
    // Four reports in the 10:00–10:05 bucket of a node expected every 60 s (5 expected): 80 % availability.
    const signals = [-60, -62, -64, -70];
    for (const [i, signalDbm] of signals.entries()) {
      const at = new Date(start.getTime() + i * 60_000);
      const reports = [{ seq: i + 1, sentAt: at.toISOString(), throughputMbps: 10 * (i + 1), radios: [{ iface: 'wlan0', signalDbm, noiseDbm: -95 }] }];
      await ingestReports(ctx.sequelize, ctx.config, { ...tokenNode, lastSeq: i ? String(i) : null }, reports, at);
    }
    await rollUp(ctx.sequelize, new Date('2031-04-01T10:06:00Z'), 300);
    const [b] = await ctx.sequelize.query<Record<string, number>>(
      `SELECT reports, expected_reports, availability_pct, signal_min_dbm, signal_avg_dbm, signal_max_dbm, snr_min_db, throughput_avg_mbps
         FROM heartbeat_rollups WHERE node_id = $1 AND bucket_s = 300 AND bucket_start = '2031-04-01T10:00:00Z'`,
      { bind: [node.id], type: QueryTypes.SELECT },
    );
    expect(b).toEqual({
      reports: 4,
      expected_reports: 5,
      availability_pct: 80,
      signal_min_dbm: -70,
      signal_avg_dbm: -64,
      signal_max_dbm: -60,
      snr_min_db: 25,
      throughput_avg_mbps: 25,
    });
    await rollUp(ctx.sequelize, new Date('2031-04-01T11:00:00Z'), 3600, 1);
    const [h] = await ctx.sequelize.query<{ reports: number; availability_pct: number }>(
      `SELECT reports, availability_pct FROM heartbeat_rollups WHERE node_id = $1 AND bucket_s = 3600 AND bucket_start = '2031-04-01T10:00:00Z'`,
      { bind: [node.id], type: QueryTypes.SELECT },
    );
    expect(h.reports).toBe(4);
    expect(h.availability_pct).toBeCloseTo((100 * 4) / 60, 6);
  });

  it('drops raw partitions past retention and deletes old roll-ups, keeping recent ones', async () => {
    const old = new Date('2030-01-01T12:00:00Z');
    await ensurePartitions(ctx.sequelize, old, 0);
    expect(await partitionsOf(ctx, 'heartbeats')).toContain('heartbeats_p20300101');
    const node = await buildNode();
    await ctx.sequelize.query(
      `INSERT INTO heartbeat_rollups (node_id, bucket_s, bucket_start, reports, expected_reports, availability_pct)
       VALUES ($1, 3600, '2029-01-01T00:00:00Z', 1, 60, 1.7), ($1, 3600, '2029-12-31T00:00:00Z', 60, 60, 100)`,
      { bind: [node.id] },
    );
    const dropped = await applyRetention(ctx.sequelize, new Date('2030-01-20T00:00:00Z'), 14, 300);
    expect(dropped).toEqual(expect.arrayContaining(['heartbeats_p20300101']));
    expect(await partitionsOf(ctx, 'heartbeats')).not.toContain('heartbeats_p20300101');
    expect(await partitionsOf(ctx, 'heartbeats')).toContain('heartbeats_p20310310'); // future ones stay
    const left = await ctx.sequelize.query<{ bucket_start: Date }>('SELECT bucket_start FROM heartbeat_rollups WHERE node_id = $1', {
      bind: [node.id],
      type: QueryTypes.SELECT,
    });
    expect(left.map((r) => new Date(r.bucket_start).toISOString())).toEqual(['2029-12-31T00:00:00.000Z']);
  });
});
