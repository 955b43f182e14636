import { QueryTypes, type Sequelize } from 'sequelize';
import { toSafeCsv } from '../../shared/csv/csvSafe';
import { type Actor, isAdmin } from '../policies/actor';

export const EXPORT_KINDS = ['sites', 'nodes', 'radios', 'links'] as const;
export type ExportKind = (typeof EXPORT_KINDS)[number];

// The same reading rights as the lists (policies/site.ts, policies/node.ts, links.ts), as SQL over
// the caller's neighbourhoods and hosted sites. Pre-shared keys are never selected.
const COLUMNS: Record<ExportKind, readonly string[]> = {
  sites: ['id', 'name', 'neighbourhood', 'latitude', 'longitude', 'groundElevationM', 'antennaHeightM', 'accessNotes'],
  nodes: ['id', 'name', 'site', 'neighbourhood', 'hardware', 'firmware', 'managementAddress', 'reportIntervalS', 'isUplink', 'state', 'lastSeenAt'],
  radios: ['id', 'node', 'iface', 'band', 'channel', 'channelWidthMHz', 'txPowerDbm', 'antennaGainDbi', 'polarisation', 'cableLossDb', 'role', 'ssid', 'encryption', 'groupRekeyS'],
  links: ['id', 'name', 'status', 'nodeA', 'radioA', 'nodeB', 'radioB'],
};

const SQL: Record<ExportKind, string> = {
  sites: `SELECT s.id, s.name, h.name AS neighbourhood, s.latitude, s.longitude, s.ground_elevation_m AS "groundElevationM",
            s.antenna_height_m AS "antennaHeightM", s.access_notes AS "accessNotes"
          FROM sites s JOIN neighbourhoods h ON h.id = s.neighbourhood_id
          WHERE $1 OR s.neighbourhood_id = ANY($2::int[]) OR s.id = ANY($3::int[]) ORDER BY lower(s.name), s.id`,
  nodes: `SELECT n.id, n.name, s.name AS site, h.name AS neighbourhood, n.hardware, n.firmware, host(n.management_address) AS "managementAddress",
            n.report_interval_s AS "reportIntervalS", n.is_uplink AS "isUplink", n.state, n.last_seen_at AS "lastSeenAt"
          FROM nodes n JOIN sites s ON s.id = n.site_id JOIN neighbourhoods h ON h.id = n.neighbourhood_id
          WHERE $1 OR n.neighbourhood_id = ANY($2::int[]) OR n.site_id = ANY($3::int[]) ORDER BY lower(n.name), n.id`,
  radios: `SELECT r.id, n.name AS node, r.iface, r.band, r.channel, r.channel_width_mhz AS "channelWidthMHz", r.tx_power_dbm AS "txPowerDbm",
            r.antenna_gain_dbi AS "antennaGainDbi", r.polarisation, r.cable_loss_db AS "cableLossDb", r.role, r.ssid, r.encryption,
            r.group_rekey_s AS "groupRekeyS"
          FROM radios r JOIN nodes n ON n.id = r.node_id
          WHERE $1 OR n.neighbourhood_id = ANY($2::int[]) OR n.site_id = ANY($3::int[]) ORDER BY lower(n.name), r.iface`,
  links: `SELECT l.id, l.name, l.status, na.name AS "nodeA", ra.iface AS "radioA", nb.name AS "nodeB", rb.iface AS "radioB"
          FROM links l JOIN radios ra ON ra.id = l.radio_a_id JOIN nodes na ON na.id = ra.node_id
               JOIN radios rb ON rb.id = l.radio_b_id JOIN nodes nb ON nb.id = rb.node_id
          WHERE $1 OR na.neighbourhood_id = ANY($2::int[]) OR nb.neighbourhood_id = ANY($2::int[]) ORDER BY l.id`,
};

/** Every row of one table the caller may read, as formula-safe CSV. */
export async function exportCsv(sequelize: Sequelize, kind: ExportKind, actor: Actor): Promise<string> {
  const operated = actor.role === 'operator' ? actor.neighbourhoodIds : [];
  // Links are infrastructure: hosts see none of them (as in links.ts), so hosted sites do not count there.
  const bind = kind === 'links' ? [isAdmin(actor), operated] : [isAdmin(actor), operated, actor.hostedSiteIds];
  const rows = await sequelize.query<Record<string, unknown>>(SQL[kind], { bind, type: QueryTypes.SELECT });
  return toSafeCsv(COLUMNS[kind], rows);
}
