// Bulk raw reports for the demo's past, written day by day into the same partitioned tables live
// reports use, then rolled up by the live roll-up code. Figures are invented but shaped like a network's.
import { QueryTypes, type Sequelize } from 'sequelize';
import { predictLink, type RadioEnd } from '../services/linkPrediction';
import { DEMO_QUIRKS } from './demoScenario';
import { type HistoryPlan, silences } from './demoHistoryPlan';

const rowCount = (meta: unknown) => Number((meta as { rowCount?: number } | null)?.rowCount ?? meta ?? 0);

const DAY_MS = 86_400_000;
/** A 5 GHz link longer than this shows rain (common practice, no source: short links barely notice). */
const RAIN_LINK_KM = 1.5;

interface RadioRow extends RadioEnd {
  id: number;
  nodeId: number;
  nodeName: string;
  iface: string;
  role: string;
  ssid: string | null;
}
interface NodeSpec {
  nodeId: number;
  firmware: string | null;
  rainKm: number;
  intervalS: number;
}
interface RadioSpec {
  nodeId: number;
  intervalS: number;
  iface: string;
  role: string;
  band: string;
  channel: number;
  width: number;
  ssid: string | null;
  /** Predicted received signal of the link into this radio (weakest station for an access point on a link); null for a plain access point. */
  baseSignalDbm: number | null;
  rainKm: number;
  drifts: boolean;
}
export interface ReportSpecs {
  nodes: NodeSpec[];
  radios: RadioSpec[];
  ids: Map<string, number>;
}

/** What each node and radio reports, from the inventory and the links' predicted budgets. */
export async function reportSpecs(sequelize: Sequelize): Promise<ReportSpecs> {
  const radios = await sequelize.query<RadioRow>(
    `SELECT r.id, r.node_id AS "nodeId", n.name AS "nodeName", r.iface, r.role, r.ssid, r.band, r.channel, r.channel_width_mhz AS "channelWidthMHz",
            r.tx_power_dbm AS "txPowerDbm", r.antenna_gain_dbi AS "antennaGainDbi", r.cable_loss_db AS "cableLossDb", s.latitude, s.longitude,
            s.ground_elevation_m AS "groundElevationM", s.antenna_height_m AS "antennaHeightM"
       FROM radios r JOIN nodes n ON n.id = r.node_id JOIN sites s ON s.id = n.site_id ORDER BY r.node_id, r.iface`,
    { type: QueryTypes.SELECT },
  );
  const nodes = await sequelize.query<{ id: number; name: string; firmware: string | null; intervalS: number }>(
    'SELECT id, name, firmware, report_interval_s AS "intervalS" FROM nodes ORDER BY id',
    { type: QueryTypes.SELECT },
  );
  const intervalOf = new Map(nodes.map((n) => [n.id, n.intervalS]));
  const links = await sequelize.query<{ a: number; b: number }>(`SELECT radio_a_id AS a, radio_b_id AS b FROM links WHERE status = 'live'`, {
    type: QueryTypes.SELECT,
  });
  const byId = new Map(radios.map((r) => [r.id, r]));
  const heard = new Map<number, { signal: number; km: number }[]>();
  for (const l of links) {
    const [a, b] = [byId.get(l.a)!, byId.get(l.b)!];
    for (const [from, to] of [
      [a, b],
      [b, a],
    ] as const) {
      const p = predictLink(from, to);
      if (p) heard.set(to.id, [...(heard.get(to.id) ?? []), { signal: p.rxSignalDbm, km: p.distanceKm }]);
    }
  }
  const radioSpecs = radios.map((r): RadioSpec => {
    const h = heard.get(r.id) ?? [];
    const longest = Math.max(0, ...h.map((x) => x.km));
    return {
      nodeId: r.nodeId,
      intervalS: intervalOf.get(r.nodeId)!,
      iface: r.iface,
      role: r.role,
      band: r.band,
      ssid: r.ssid,
      width: r.channelWidthMHz,
      channel: DEMO_QUIRKS.channels[r.nodeName]?.[r.iface] ?? r.channel,
      baseSignalDbm: h.length ? Math.min(...h.map((x) => x.signal)) : null,
      rainKm: r.band === '5' && longest > RAIN_LINK_KM ? longest : 0,
      drifts: r.nodeName === DEMO_QUIRKS.driftingNode && r.role === 'backhaul-client',
    };
  });
  return {
    nodes: nodes.map((n) => ({
      nodeId: n.id,
      intervalS: n.intervalS,
      firmware: DEMO_QUIRKS.firmware[n.name] ?? n.firmware,
      rainKm: Math.max(0, ...radioSpecs.filter((r) => r.nodeId === n.id).map((r) => r.rainKm)),
    })),
    radios: radioSpecs,
    ids: new Map(nodes.map((n) => [n.name, n.id])),
  };
}

// Shared pieces of both inserts: one tick per node and report interval (each node at its own second), minus its silences.
const TICKS = `
  quiet AS (SELECT * FROM jsonb_to_recordset($4::jsonb) AS q("nodeId" int, after timestamptz, until timestamptz)),
  rain AS (SELECT * FROM jsonb_to_recordset($5::jsonb) AS r("from" timestamptz, "to" timestamptz, "peakDbPerKm" float8))`;
const TICKS_OF = `CROSS JOIN LATERAL generate_series($1::timestamptz, $2::timestamptz - interval '1 minute', make_interval(secs => s."intervalS")) AS mi(m)`;
const LIVE = (alias: string) =>
  `NOT EXISTS (SELECT 1 FROM quiet q WHERE q."nodeId" = ${alias}."nodeId" AND ${alias}.t > q.after AND ${alias}.t <= q.until) AND ${alias}.t < $6`;
// Busiest around 21:00 local time (the simulator's rhythm); rain peaks halfway through its spell.
const BUSY = (t: string) =>
  `(0.5 + 0.5 * cos(((extract(hour FROM ${t} AT TIME ZONE $7) + extract(minute FROM ${t} AT TIME ZONE $7) / 60.0 - 21) / 24) * 2 * pi()))`;
const RAIN_DB_PER_KM = (t: string) =>
  `coalesce((SELECT max(r."peakDbPerKm" * sin(pi() * extract(epoch FROM ${t} - r."from") / extract(epoch FROM r."to" - r."from"))) FROM rain r WHERE ${t} BETWEEN r."from" AND r."to"), 0)`;

// One row per report: each node's radios for a tick are gathered into the row's radios column (as a node sends them).
const HEARTBEATS_SQL = (table: string) => `
WITH spec AS (SELECT * FROM jsonb_to_recordset($3::jsonb) AS x("nodeId" int, "intervalS" int, firmware text, "rainKm" float8)), ${TICKS},
rspec AS (SELECT * FROM jsonb_to_recordset($11::jsonb) AS x("nodeId" int, "intervalS" int, iface text, role text, band text, channel int, width int, ssid text,
            "baseSignalDbm" float8, "rainKm" float8, drifts boolean)),
ticks AS (SELECT s.*, mi.m + make_interval(secs => (s."nodeId" * 7) % 60) AS t FROM spec s ${TICKS_OF}),
live AS (SELECT k.*, ${BUSY('k.t')} AS busy, ${RAIN_DB_PER_KM('k.t')} * k."rainKm" AS "rainDb" FROM ticks k WHERE ${LIVE('k')}),
rticks AS (SELECT s.*, mi.m + make_interval(secs => (s."nodeId" * 7) % 60) AS t FROM rspec s ${TICKS_OF}),
rlive AS (SELECT k.*, ${BUSY('k.t')} AS busy, ${RAIN_DB_PER_KM('k.t')} * k."rainKm" AS "rainDb",
                 CASE WHEN k.drifts AND k.t > $9::timestamptz AND k.t > $8::timestamptz
                      THEN $10::float8 * power(extract(epoch FROM k.t - $9::timestamptz) / extract(epoch FROM $6::timestamptz - $9::timestamptz), 2)
                      ELSE 0 END AS "driftDb"
            FROM rticks k WHERE ${LIVE('k')}),
rad AS (
  SELECT "nodeId", t, jsonb_agg(jsonb_strip_nulls(jsonb_build_object('iface', iface, 'role', role, 'band', band, 'channel', channel, 'channelWidthMHz', width,
           'ssid', ssid, 'signalDbm', signal, 'noiseDbm', noise, 'txRateMbps', tx, 'rxRateMbps', rx, 'clients', clients)) ORDER BY iface) AS radios
    FROM (
      SELECT "nodeId", t, iface, role, band, channel, width, ssid,
             round(CASE WHEN "baseSignalDbm" IS NULL THEN -58 - random() * 12
                        ELSE "baseSignalDbm" + 1.5 * sin(extract(epoch FROM t) / 25200 * 2 * pi() + "nodeId") + (random() - 0.5) * 2 - "rainDb" + "driftDb"
                   END::numeric, 1) AS signal,
             round((-95 + (random() - 0.5) * 1.6)::numeric, 1) AS noise,
             CASE WHEN role = 'access-point' THEN 72 ELSE greatest(13, 150 - 8 * "rainDb") END AS tx,
             CASE WHEN role = 'access-point' THEN 65 ELSE greatest(13, 135 - 8 * "rainDb") END AS rx,
             CASE WHEN role = 'access-point' THEN round(1 + 11 * busy * (0.7 + 0.3 * random()))::int END AS clients
        FROM rlive) x
   GROUP BY 1, 2
)
INSERT INTO ${table} (node_id, seq, received_at, sent_at, uptime_s, load1, mem_free_kb, firmware, throughput_mbps, latency_ms, radios)
SELECT "nodeId", floor(extract(epoch FROM t) / 60)::bigint, t, t - interval '300 milliseconds', extract(epoch FROM t - $8::timestamptz) + 3456000,
       round((0.1 + 0.8 * busy + random() * 0.1)::numeric, 2), 30000 + floor(random() * 5000), firmware,
       round(greatest(1, 60 - 36 * busy - 3 * "rainDb" + (random() - 0.5) * 6)::numeric, 1),
       round((8 + 20 * busy + "rainDb" + random() * 4)::numeric, 1), coalesce(rad.radios, '[]'::jsonb)
  FROM live LEFT JOIN rad USING ("nodeId", t)`;

const stamp = (d: Date) => d.toISOString().slice(0, 10).replace(/-/g, '');

async function tableExists(sequelize: Sequelize, name: string) {
  const [row] = await sequelize.query<{ found: boolean }>('SELECT to_regclass($1) IS NOT NULL AS found', { bind: [name], type: QueryTypes.SELECT });
  return row.found;
}

/**
 * One day's reports into the daily partitions the storage job names and retention drops
 * (`heartbeats_pYYYYMMDD`). A missing partition is filled while detached and then attached,
 * which is several times faster than inserting through its index; an existing one is filled in place.
 */
export async function writeDay(sequelize: Sequelize, plan: HistoryPlan, specs: ReportSpecs, day: Date, timeZone: string) {
  const next = new Date(day.getTime() + DAY_MS);
  // Only the silences and rain of this day, so each row is checked against a handful of spans.
  const quiet = [...silences(plan)]
    .flatMap(([node, spans]) => spans.map((s) => ({ nodeId: specs.ids.get(node), after: s.after, until: s.until })))
    .filter((q) => q.after < next && q.until >= day);
  const rain = plan.rain.filter((r) => r.from < next && r.to >= day);
  const common = [day, next, JSON.stringify(quiet), JSON.stringify(rain), plan.end, timeZone];
  const [from, to, q, rainSpans, end, zone] = common;
  // $8 is the history's start (uptime); $9, $10 the drift for radios; $11 the radios.
  const bind = [from, to, JSON.stringify(specs.nodes), q, rainSpans, end, zone, plan.start, plan.drift.from, plan.drift.depthDb, JSON.stringify(specs.radios)];
  const name = `heartbeats_p${stamp(day)}`;
  if (await tableExists(sequelize, name)) {
    const [, count] = await sequelize.query(HEARTBEATS_SQL('heartbeats'), { bind });
    return rowCount(count);
  }
  let rows = 0;
  await sequelize.transaction(async (transaction) => {
    await sequelize.query(`CREATE TABLE ${name} (LIKE heartbeats INCLUDING DEFAULTS)`, { transaction });
    const [, count] = await sequelize.query(HEARTBEATS_SQL(name), { bind, transaction });
    rows = rowCount(count);
    await sequelize.query(`CREATE INDEX ON ${name} (node_id, received_at)`, { transaction });
    await sequelize.query(`CREATE INDEX ON ${name} (node_id, (coalesce(boot_id, '')), seq)`, { transaction });
    const bounds = `FROM ('${day.toISOString()}') TO ('${next.toISOString()}')`;
    await sequelize.query(`ALTER TABLE heartbeats ATTACH PARTITION ${name} FOR VALUES ${bounds}`, { transaction });
  });
  return rows;
}
