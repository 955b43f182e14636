import { QueryTypes, type Sequelize } from 'sequelize';
import type { HeartbeatReport } from '../../shared/schemas/heartbeat';
import { forgetAirViews } from './airViewCache';
import { forgetInventory, inventoryRadios } from './drift';

/** MACs are compared in one spelling: lower-case hex with colons. */
export const normalMac = (mac: string) => mac.toLowerCase();

/**
 * Remembers each inventory radio's own MAC from the newest report. Reads the node's cached
 * inventory, so a report whose MACs are already known costs nothing; a change is one short
 * transaction. A MAC that another node's radio held before has moved there (a radio swapped
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
  const touchedNodes = new Set<number>();
  await sequelize.transaction(async (transaction) => {
    for (const { mac, radio } of changed) {
      const previous = await sequelize.query<{ id: number; nodeId: number; iface: string }>(
        'UPDATE radios SET mac = NULL WHERE mac = $1 AND id <> $2 RETURNING id, node_id AS "nodeId", iface',
        { bind: [mac, radio.id], type: QueryTypes.SELECT, transaction },
      );
      for (const p of previous) {
        touchedNodes.add(p.nodeId);
        if (p.nodeId === nodeId) continue;
        await sequelize.query(
          `INSERT INTO radio_mac_moves (mac, from_node_id, from_iface, to_node_id, to_iface, at)
           SELECT $1, $2, $3, $4, $5, $6
            WHERE NOT EXISTS (SELECT 1 FROM radio_mac_moves WHERE mac = $1 AND from_node_id = $2 AND to_node_id = $4 AND at > $6::timestamptz - interval '1 hour')`,
          { bind: [mac, p.nodeId, p.iface, nodeId, radio.iface, now], transaction },
        );
      }
      // Raw SQL on purpose: no audit entry and no updated_at bump, so inventory signatures stay put.
      await sequelize.query('UPDATE radios SET mac = $2, mac_reported_at = $3 WHERE id = $1', { bind: [radio.id, mac, now], transaction });
    }
  });
  for (const { mac, radio } of changed) radio.mac = mac;
  touchedNodes.forEach((id) => id !== nodeId && forgetInventory(id));
  // A MAC learned or moved changes which reports name which radio.
  forgetAirViews();
  return changed.length;
}
