import { QueryTypes, type Sequelize } from 'sequelize';
import type { HeartbeatReport } from '../../shared/schemas/heartbeat';
import { cacheGeneration, cachesForgot, ingestCacheMs } from './ingestCacheMs';

export interface DriftItem {
  field: string;
  expected: string | number | null;
  reported: string | number | null;
}

export interface InventoryRadio {
  id: number;
  iface: string;
  channel: number;
  channelWidthMHz: number;
  ssid: string | null;
  mac: string | null;
}
const cache = new Map<number, { at: number; radios: InventoryRadio[] }>();

export async function inventoryRadios(sequelize: Sequelize, nodeId: number): Promise<InventoryRadio[]> {
  const hit = cache.get(nodeId);
  if (hit && Date.now() - hit.at < ingestCacheMs()) return hit.radios;
  const generation = cacheGeneration();
  const radios = await sequelize.query<InventoryRadio>(
    'SELECT id, iface, channel, channel_width_mhz AS "channelWidthMHz", ssid, mac FROM radios WHERE node_id = $1',
    { bind: [nodeId], type: QueryTypes.SELECT },
  );
  if (generation === cacheGeneration()) cache.set(nodeId, { at: Date.now(), radios });
  return radios;
}

export function forgetInventory(nodeId?: number) {
  if (nodeId === undefined) cache.clear();
  else cache.delete(nodeId);
  cachesForgot();
}

/** Settings the node reports that differ from what the inventory says it should run. */
export async function driftOf(sequelize: Sequelize, nodeId: number, inventoryFirmware: string | null, r: HeartbeatReport): Promise<DriftItem[]> {
  const out: DriftItem[] = [];
  if (r.firmware && inventoryFirmware && r.firmware !== inventoryFirmware) out.push({ field: 'firmware', expected: inventoryFirmware, reported: r.firmware });
  if (!r.radios?.length) return out;
  const inventory = await inventoryRadios(sequelize, nodeId);
  for (const reported of r.radios) {
    const planned = inventory.find((i) => i.iface === reported.iface);
    if (!planned) continue;
    if (reported.channel !== undefined && reported.channel !== planned.channel)
      out.push({ field: `${reported.iface}.channel`, expected: planned.channel, reported: reported.channel });
    if (reported.channelWidthMHz !== undefined && reported.channelWidthMHz !== planned.channelWidthMHz)
      out.push({ field: `${reported.iface}.channelWidthMHz`, expected: planned.channelWidthMHz, reported: reported.channelWidthMHz });
    if (reported.ssid !== undefined && planned.ssid !== null && reported.ssid !== planned.ssid)
      out.push({ field: `${reported.iface}.ssid`, expected: planned.ssid, reported: reported.ssid });
  }
  return out;
}
