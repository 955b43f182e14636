import { QueryTypes, type Sequelize } from 'sequelize';
import type { HeartbeatReport } from '../../shared/schemas/heartbeat';
import { forgetAirViews } from './airViewCache';
import { forgetInventory, inventoryRadios } from './drift';

/** MACs are compared in one spelling: lower-case hex with colons. */
export const normalMac = (mac: string) => mac.toLowerCase();

/**
 * Remembers each inventory radio's own MAC from the newest report. Reads the node's cached
 * inventory, so a report whose MACs are already known costs nothing; a change is one statement.
 * A MAC that another node's radio held before has moved there (a radio swapped
 * between roofs): the move is recorded once per pair and hour, and the old radio forgets it.
 */
export async function rememberMacs(sequelize: Sequelize, nodeId: number, report: HeartbeatReport, now: Date): Promise<number> {
  const reported = (report.radios ?? []).filter((r) => r.mac);
  if (!reported.length) return 0;
  const inventory = await inventoryRadios(sequelize, nodeId);
  const changed = reported
    .map((r) => ({ mac: normalMac(r.mac!), radio: inventory.find((i) => i.iface === r.iface) }))
    .filter((c): c is { mac: string; radio: NonNullable<typeof c.radio> } => c.radio !== undefined && c.radio.mac !== c.mac);
  if (!changed.length) return 0;
  // One statement (no transaction of its own): the node's radios take their new MACs, any other radio that held
  // one forgets it, and a move to another node is recorded once per pair and hour. A statement must touch each
  // row once, so when a report names one MAC on two of its radios, the last radio named keeps it.
  const byMac = new Map(changed.map((c) => [c.mac, c]));
  const rows = [...byMac.values()];
  // Arrays rather than a JSON set, so the planner sees how few MACs there are and takes the MAC index.
  const previous = await sequelize.query<{ nodeId: number }>(
    `WITH changed AS (SELECT * FROM unnest($1::int[], $2::text[], $3::text[]) AS c(id, mac, iface)),
     previous AS (
       UPDATE radios r SET mac = NULL FROM changed c
        WHERE r.mac = ANY($2::text[]) AND r.mac = c.mac AND r.id <> ALL($1::int[])
       RETURNING r.node_id, r.iface AS from_iface, c.mac, c.iface AS to_iface
     ),
     moves AS (
       INSERT INTO radio_mac_moves (mac, from_node_id, from_iface, to_node_id, to_iface, at)
       SELECT DISTINCT ON (p.mac, p.node_id) p.mac, p.node_id, p.from_iface, $4, p.to_iface, $5 FROM previous p
        WHERE p.node_id <> $4
          AND NOT EXISTS (SELECT 1 FROM radio_mac_moves m WHERE m.mac = p.mac AND m.from_node_id = p.node_id AND m.to_node_id = $4 AND m.at > $5::timestamptz - interval '1 hour')
     ),
     -- Raw SQL on purpose: no audit entry and no updated_at bump, so inventory signatures stay put.
     own AS (UPDATE radios r SET mac = c.mac, mac_reported_at = $5 FROM changed c WHERE r.id = ANY($1::int[]) AND r.id = c.id)
     -- The old holder's node is told to every instance (migration 0019's channel) only when a MAC moved.
     SELECT DISTINCT p.node_id AS "nodeId" FROM previous p CROSS JOIN LATERAL (SELECT pg_notify('parapet_ingest', 'radios:' || p.node_id)) told`,
    {
      bind: [rows.map((c) => c.radio.id), rows.map((c) => c.mac), rows.map((c) => c.radio.iface), nodeId, now],
      type: QueryTypes.SELECT,
    },
  );
  for (const { mac, radio } of rows) radio.mac = mac;
  for (const p of previous) if (p.nodeId !== nodeId) forgetInventory(p.nodeId);
  // A MAC learned or moved changes which reports name which radio.
  forgetAirViews();
  return changed.length;
}
