import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { QueryTypes } from 'sequelize';
import { describe, expect, it } from 'vitest';
import { TownReporter, planTown, seedTown, type SeededNode } from '../../server/tools/simulateTown';
import { postReports, useApi } from '../helpers/api';

const NO_FAULTS = { powerCutEveryS: 0, powerCutS: 0, flakyShare: 0 };

describe('the town simulator', () => {
  const ctx = useApi({ ingestRateLimitPerMin: 100_000 });
  const plan = planTown(260); // two neighbourhoods: 250 and 10 nodes
  let seeded: SeededNode[];

  it('writes the town as inventory: nodes, one uplink per neighbourhood, a live backhaul link from each node to its parent', async () => {
    seeded = await seedTown(ctx.sequelize, plan);
    expect(seeded).toHaveLength(260);
    const [row] = await ctx.sequelize.query<{ nodes: string; uplinks: string; hoods: string; links: string; tokens: string }>(
      `SELECT (SELECT count(*) FROM nodes) AS nodes, (SELECT count(*) FROM nodes WHERE is_uplink) AS uplinks,
              (SELECT count(*) FROM neighbourhoods) AS hoods, (SELECT count(*) FROM links WHERE status = 'live') AS links,
              (SELECT count(*) FROM node_tokens WHERE revoked_at IS NULL) AS tokens`,
      { type: QueryTypes.SELECT },
    );
    expect(row).toEqual({ nodes: '260', uplinks: '2', hoods: '2', links: '258', tokens: '260' });
    // Each link joins the parent's backhaul AP to the child's backhaul client, as the plan says.
    const links = await ctx.sequelize.query<{ parent: string; child: string; aRole: string; bRole: string }>(
      `SELECT na.name AS parent, nb.name AS child, ra.role AS "aRole", rb.role AS "bRole"
         FROM links l JOIN radios ra ON ra.id = l.radio_a_id JOIN nodes na ON na.id = ra.node_id
         JOIN radios rb ON rb.id = l.radio_b_id JOIN nodes nb ON nb.id = rb.node_id`,
      { type: QueryTypes.SELECT },
    );
    const parentOf = new Map(links.map((l) => [l.child, l.parent]));
    for (const n of plan.nodes.filter((x) => x.parent !== null)) expect(parentOf.get(n.name)).toBe(plan.nodes[n.parent!].name);
    expect(new Set(links.map((l) => `${l.aRole}>${l.bRole}`))).toEqual(new Set(['backhaul-ap>backhaul-client']));
  });

  it('a second seeding reuses the same nodes and revokes the tokens it handed out before', async () => {
    const again = await seedTown(ctx.sequelize, plan);
    expect(again.map((n) => n.id)).toEqual(seeded.map((n) => n.id));
    const report = { seq: 1, sentAt: new Date().toISOString() };
    expect((await postReports(ctx, seeded[5].token, report)).status).toBe(401);
    expect((await postReports(ctx, again[5].token, report)).status).toBe(202);
    const [{ n }] = await ctx.sequelize.query<{ n: string }>('SELECT count(*) AS n FROM links', { type: QueryTypes.SELECT });
    expect(n).toBe('258');
    seeded = again;
  });

  it('every node reports over HTTP with its own token, and every accepted report is stored', async () => {
    await ctx.sequelize.query('TRUNCATE heartbeats');
    const server = http.createServer(ctx.app).listen(0, '127.0.0.1');
    await new Promise((r) => server.once('listening', r));
    const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    const statuses: number[] = [];
    const reporter = new TownReporter(url, plan, seeded, (r) => statuses.push(r.status), NO_FAULTS, 5);
    try {
      reporter.start();
      const deadline = Date.now() + 150_000; // a busy machine: wait on the count, not on a fixed time
      while (reporter.counts.accepted < 260 && Date.now() < deadline) await new Promise((r) => setTimeout(r, 100));
    } finally {
      await reporter.stop();
      await new Promise((r) => server.close(r));
    }
    expect(reporter.counts.accepted).toBeGreaterThanOrEqual(260);
    expect(new Set(statuses)).toEqual(new Set([202]));
    const [row] = await ctx.sequelize.query<{ rows: string; nodes: string; radios: string }>(
      `SELECT (SELECT count(*) FROM heartbeats) AS rows, (SELECT count(DISTINCT node_id) FROM heartbeats) AS nodes,
              (SELECT count(*) FROM heartbeat_radio_rows) AS radios`,
      { type: QueryTypes.SELECT },
    );
    expect(Number(row.rows)).toBe(reporter.counts.accepted);
    expect(Number(row.nodes)).toBe(260);
    expect(Number(row.radios)).toBeGreaterThanOrEqual(260 * 2);
  }, 180_000);
});
