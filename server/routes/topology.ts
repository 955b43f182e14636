import { Router } from 'express';
import { QueryTypes, type Sequelize } from 'sequelize';
import { actorOf } from '../middlewares/requireUser';
import { type Actor, isAdmin } from '../policies/actor';
import { predictLink, type RadioEnd } from '../services/linkPrediction';

interface TopoNode {
  id: number; name: string; siteId: number; siteName: string; neighbourhoodId: number; latitude: number; longitude: number;
  state: string; isUplink: boolean; lastSeenAt: string | null; openOutageId: number | null;
}
type TopoLinkRow = { id: number; name: string | null; status: string; nodeAId: number; nodeBId: number; measuredSignalDbm: number | null } & {
  [K in keyof RadioEnd as `a_${K}` | `b_${K}`]: RadioEnd[K];
};

const end = (r: TopoLinkRow, p: 'a' | 'b'): RadioEnd => ({
  band: r[`${p}_band`], channel: r[`${p}_channel`], channelWidthMHz: r[`${p}_channelWidthMHz`], txPowerDbm: r[`${p}_txPowerDbm`],
  antennaGainDbi: r[`${p}_antennaGainDbi`], cableLossDb: r[`${p}_cableLossDb`], latitude: r[`${p}_latitude`], longitude: r[`${p}_longitude`],
  groundElevationM: r[`${p}_groundElevationM`], antennaHeightM: r[`${p}_antennaHeightM`],
});

/** Where the caller may look: admins all, operators their neighbourhoods, everyone the sites they host. */
function scopeSql(actor: Actor) {
  if (isAdmin(actor)) return { sql: 'true', bind: [] as unknown[] };
  return { sql: '(n.neighbourhood_id = ANY($1::int[]) OR n.site_id = ANY($2::int[]))', bind: [actor.role === 'operator' ? actor.neighbourhoodIds : [], actor.hostedSiteIds] };
}

const radioCols = (p: 'a' | 'b') => `
  r${p}.band AS "${p}_band", r${p}.channel AS "${p}_channel", r${p}.channel_width_mhz AS "${p}_channelWidthMHz",
  r${p}.tx_power_dbm AS "${p}_txPowerDbm", r${p}.antenna_gain_dbi AS "${p}_antennaGainDbi", r${p}.cable_loss_db AS "${p}_cableLossDb",
  s${p}.latitude AS "${p}_latitude", s${p}.longitude AS "${p}_longitude", s${p}.ground_elevation_m AS "${p}_groundElevationM",
  s${p}.antenna_height_m AS "${p}_antennaHeightM"`;

/** The graph: nodes at their sites' coordinates, links with predicted margin and capacity, both ends readable. */
export function topologyRoutes(sequelize: Sequelize) {
  const router = Router();
  router.get('/', async (req, res) => {
    const actor = actorOf(req);
    const scope = scopeSql(actor);
    const nodes = await sequelize.query<TopoNode>(
      `SELECT n.id, n.name, n.site_id AS "siteId", s.name AS "siteName", n.neighbourhood_id AS "neighbourhoodId", s.latitude, s.longitude,
              n.state, n.is_uplink AS "isUplink", n.last_seen_at AS "lastSeenAt", o.id AS "openOutageId"
         FROM nodes n JOIN sites s ON s.id = n.site_id
         LEFT JOIN outages o ON o.node_id = n.id AND o.ended_at IS NULL
        WHERE ${scope.sql} ORDER BY n.id`,
      { bind: scope.bind, type: QueryTypes.SELECT },
    );
    const ids = nodes.map((n) => n.id);
    const rows = await sequelize.query<TopoLinkRow>(
      `SELECT l.id, l.name, l.status, ra.node_id AS "nodeAId", rb.node_id AS "nodeBId",
              (SELECT (x->>'signalDbm')::float8 FROM jsonb_array_elements(nb.last_report->'radios') x WHERE x->>'iface' = rb.iface LIMIT 1)
                AS "measuredSignalDbm",
              ${radioCols('a')}, ${radioCols('b')}
         FROM links l
         JOIN radios ra ON ra.id = l.radio_a_id JOIN nodes na ON na.id = ra.node_id JOIN sites sa ON sa.id = na.site_id
         JOIN radios rb ON rb.id = l.radio_b_id JOIN nodes nb ON nb.id = rb.node_id JOIN sites sb ON sb.id = nb.site_id
        WHERE ra.node_id = ANY($1::int[]) AND rb.node_id = ANY($1::int[])`,
      { bind: [ids], type: QueryTypes.SELECT },
    );
    const links = rows.map((r) => {
      const p = predictLink(end(r, 'a'), end(r, 'b'));
      return {
        id: r.id, name: r.name, status: r.status, nodeAId: r.nodeAId, nodeBId: r.nodeBId,
        distanceKm: p?.distanceKm ?? null, predictedSignalDbm: p?.rxSignalDbm ?? null, fadeMarginDb: p?.fadeMarginDb ?? null,
        expectedRateMbps: p?.expectedRateMbps ?? null, measuredSignalDbm: r.measuredSignalDbm,
      };
    });
    res.json({ data: { nodes, links } });
  });
  return router;
}
