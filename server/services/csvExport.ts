import { QueryTypes, type Sequelize } from 'sequelize';
import { toSafeCsv } from '../../shared/csv/csvSafe';
import type { Actor } from '../policies/actor';
import { linkScopeSql } from '../policies/link';
import { nodeScopeSql } from '../policies/node';
import { siteScopeSql } from '../policies/site';

export const EXPORT_KINDS = ['sites', 'nodes', 'radios', 'links'] as const;
export type ExportKind = (typeof EXPORT_KINDS)[number];

// The same reading rights as the lists: the raw-SQL scopes of policies/site.ts, node.ts and link.ts
// (links are infrastructure, so hosts export none). Pre-shared keys are never selected.
const COLUMNS: Record<ExportKind, readonly string[]> = {
  sites: ['id', 'name', 'neighbourhood', 'latitude', 'longitude', 'groundElevationM', 'antennaHeightM', 'accessNotes'],
  nodes: ['id', 'name', 'site', 'neighbourhood', 'hardware', 'firmware', 'managementAddress', 'reportIntervalS', 'isUplink', 'state', 'lastSeenAt'],
  radios: [
    'id',
    'node',
    'iface',
    'band',
    'channel',
    'channelWidthMHz',
    'txPowerDbm',
    'antennaGainDbi',
    'polarisation',
    'cableLossDb',
    'role',
    'ssid',
    'encryption',
    'groupRekeyS',
  ],
  links: ['id', 'name', 'status', 'nodeA', 'radioA', 'nodeB', 'radioB'],
};

const SQL: Record<ExportKind, (a: Actor) => string> = {
  sites: (a) => `SELECT s.id, s.name, h.name AS neighbourhood, s.latitude, s.longitude, s.ground_elevation_m AS "groundElevationM",
            s.antenna_height_m AS "antennaHeightM", s.access_notes AS "accessNotes"
          FROM sites s JOIN neighbourhoods h ON h.id = s.neighbourhood_id
          WHERE ${siteScopeSql(a, 's')} ORDER BY lower(s.name), s.id`,
  nodes: (a) => `SELECT n.id, n.name, s.name AS site, h.name AS neighbourhood, n.hardware, n.firmware, host(n.management_address) AS "managementAddress",
            n.report_interval_s AS "reportIntervalS", n.is_uplink AS "isUplink", n.state, n.last_seen_at AS "lastSeenAt"
          FROM nodes n JOIN sites s ON s.id = n.site_id JOIN neighbourhoods h ON h.id = n.neighbourhood_id
          WHERE ${nodeScopeSql(a, 'n')} ORDER BY lower(n.name), n.id`,
  radios: (a) => `SELECT r.id, n.name AS node, r.iface, r.band, r.channel, r.channel_width_mhz AS "channelWidthMHz", r.tx_power_dbm AS "txPowerDbm",
            r.antenna_gain_dbi AS "antennaGainDbi", r.polarisation, r.cable_loss_db AS "cableLossDb", r.role, r.ssid, r.encryption,
            r.group_rekey_s AS "groupRekeyS"
          FROM radios r JOIN nodes n ON n.id = r.node_id
          WHERE ${nodeScopeSql(a, 'n')} ORDER BY lower(n.name), r.iface`,
  links: (a) => `SELECT l.id, l.name, l.status, na.name AS "nodeA", ra.iface AS "radioA", nb.name AS "nodeB", rb.iface AS "radioB"
          FROM links l JOIN radios ra ON ra.id = l.radio_a_id JOIN nodes na ON na.id = ra.node_id
               JOIN radios rb ON rb.id = l.radio_b_id JOIN nodes nb ON nb.id = rb.node_id
          WHERE ${linkScopeSql(a, 'na.neighbourhood_id', 'nb.neighbourhood_id')} ORDER BY l.id`,
};

/** Every row of one table the caller may read, as formula-safe CSV. */
export async function exportCsv(sequelize: Sequelize, kind: ExportKind, actor: Actor): Promise<string> {
  const rows = await sequelize.query<Record<string, unknown>>(SQL[kind](actor), { type: QueryTypes.SELECT });
  return toSafeCsv(COLUMNS[kind], rows);
}
