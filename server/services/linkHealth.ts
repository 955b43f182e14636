import { QueryTypes, type Sequelize } from 'sequelize';
import { assessLinkHealth, type LinkHealth } from '../../shared/radio/linkVerdict';
import { NotFound } from '../errors';
import type { Actor } from '../policies/actor';
import { mayReadLink } from '../policies/link';
import { predictLink, type RadioEnd } from './linkPrediction';

/** The 7-day window the baseline is the median of. */
export const BASELINE_DAYS = 7;

interface EndRow extends RadioEnd {
  radioId: number;
  nodeId: number;
  iface: string;
  neighbourhoodId: number;
  nodeName: string;
  lastReport: { receivedAt?: string; radios?: { iface?: string; signalDbm?: number | null }[] } | null;
}
export interface DirectionHealth extends LinkHealth {
  fromRadioId: number;
  toRadioId: number;
  /** The receiving radio, where the signal is measured. */
  toNodeId: number;
  toNodeName: string;
  predictedSignalDbm: number | null;
  measuredSignalDbm: number | null;
  measuredAt: string | null;
  baselineSignalDbm: number | null;
  baselineSamples: number;
}

const END_SQL = `SELECT r.id AS "radioId", r.node_id AS "nodeId", r.iface, n.neighbourhood_id AS "neighbourhoodId", n.name AS "nodeName",
  n.last_report AS "lastReport", r.band, r.channel, r.channel_width_mhz AS "channelWidthMHz", r.tx_power_dbm AS "txPowerDbm",
  r.antenna_gain_dbi AS "antennaGainDbi", r.cable_loss_db AS "cableLossDb", s.latitude, s.longitude,
  s.ground_elevation_m AS "groundElevationM", s.antenna_height_m AS "antennaHeightM"
  FROM radios r JOIN nodes n ON n.id = r.node_id JOIN sites s ON s.id = n.site_id WHERE r.id = $1`;

async function loadEnd(sequelize: Sequelize, radioId: number): Promise<EndRow> {
  const [row] = await sequelize.query<EndRow>(END_SQL, { bind: [radioId], type: QueryTypes.SELECT });
  return row;
}

// Median of the receiving radio's reported signal over the window (the link's own recent baseline).
async function baseline(sequelize: Sequelize, end: EndRow, now: Date) {
  const [row] = await sequelize.query<{ median: number | null; samples: string }>(
    `SELECT percentile_cont(0.5) WITHIN GROUP (ORDER BY signal_dbm) AS median, count(signal_dbm) AS samples
       FROM heartbeat_radio_rows WHERE node_id = $1 AND iface = $2 AND signal_dbm IS NOT NULL
        AND received_at >= $3::timestamptz - make_interval(days => $4::int) AND received_at <= $3::timestamptz`,
    { bind: [end.nodeId, end.iface, now.toISOString(), BASELINE_DAYS], type: QueryTypes.SELECT },
  );
  return { median: row.median === null ? null : Math.round(row.median * 100) / 100, samples: Number(row.samples) };
}

async function direction(sequelize: Sequelize, from: EndRow, to: EndRow, now: Date): Promise<DirectionHealth> {
  const predicted = predictLink(from, to)?.rxSignalDbm ?? null;
  const reported = to.lastReport?.radios?.find((r) => r.iface === to.iface);
  const measured = typeof reported?.signalDbm === 'number' ? reported.signalDbm : null;
  const base = await baseline(sequelize, to, now);
  return {
    fromRadioId: from.radioId,
    toRadioId: to.radioId,
    toNodeId: to.nodeId,
    toNodeName: to.nodeName,
    predictedSignalDbm: predicted,
    measuredSignalDbm: measured,
    measuredAt: measured === null ? null : (to.lastReport?.receivedAt ?? null),
    baselineSignalDbm: base.median,
    baselineSamples: base.samples,
    ...assessLinkHealth({ measuredSignalDbm: measured, predictedSignalDbm: predicted, baselineSignalDbm: base.median }),
  };
}

/** Measured against predicted signal in both directions; links are read by admins and the operators of either end. */
export async function linkHealth(sequelize: Sequelize, actor: Actor, linkId: number, now: Date) {
  const [link] = await sequelize.query<{ id: number; name: string | null; status: string; radioAId: number; radioBId: number }>(
    'SELECT id, name, status, radio_a_id AS "radioAId", radio_b_id AS "radioBId" FROM links WHERE id = $1',
    { bind: [linkId], type: QueryTypes.SELECT },
  );
  if (!link) throw NotFound(`Link ${linkId}`);
  const [a, b] = await Promise.all([loadEnd(sequelize, link.radioAId), loadEnd(sequelize, link.radioBId)]);
  if (!mayReadLink(actor, { neighbourhoodAId: a.neighbourhoodId, neighbourhoodBId: b.neighbourhoodId })) throw NotFound(`Link ${linkId}`);
  const directions = [await direction(sequelize, a, b, now), await direction(sequelize, b, a, now)];
  return {
    linkId: link.id,
    name: link.name,
    status: link.status,
    baselineDays: BASELINE_DAYS,
    flagged: directions.some((d) => d.flagged),
    directions,
  };
}
