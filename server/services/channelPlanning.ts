import { QueryTypes, type Sequelize } from 'sequelize';
import type { Band, ChannelWidthMHz } from '../../shared/enums';
import {
  congestionMwByChannel,
  recommendChannels,
  type ChannelAssignment,
  type ObservedNetwork,
  type RadioOnAir,
  type RadioToPlan,
} from '../../shared/radio/channelPlan';
import { allowedChannelNumbers, validChannels, type ChannelRegion } from '../../shared/radio/channels';
import type { ChannelApplyBody } from '../../shared/schemas/planningRecords';
import { Invalid, NotFound } from '../errors';
import { Node, Radio } from '../models';
import { authorize } from '../policies/authorize';
import { nodeScope } from '../policies/node';
import { recordChanges, type ChangeRecord } from './changeHistory';
import { eirpDbm } from '../../shared/radio/linkBudget';
import { mwToDbm } from '../../shared/radio/units';
import { type Actor, isAdmin, mayManage } from '../policies/actor';

interface RadioRow {
  id: number;
  nodeId: number;
  nodeName: string;
  neighbourhoodId: number;
  iface: string;
  band: Band;
  channel: number;
  channelWidthMHz: ChannelWidthMHz;
  txPowerDbm: number;
  antennaGainDbi: number;
  cableLossDb: number;
  lat: number;
  lon: number;
}
interface SurveyRow {
  nodeId: number;
  surveyId: number;
  createdAt: Date;
  rows: (ObservedNetwork & { band: Band })[];
}

/** Radios the caller plans: admins every radio, operators those of their neighbourhoods. */
const mayPlanRadio = (actor: Actor, r: RadioRow) => mayManage(actor, r.neighbourhoodId);

async function loadRadios(sequelize: Sequelize): Promise<RadioRow[]> {
  return sequelize.query<RadioRow>(
    `SELECT r.id, r.node_id AS "nodeId", n.name AS "nodeName", n.neighbourhood_id AS "neighbourhoodId", r.iface, r.band, r.channel,
            r.channel_width_mhz AS "channelWidthMHz", r.tx_power_dbm AS "txPowerDbm", r.antenna_gain_dbi AS "antennaGainDbi",
            r.cable_loss_db AS "cableLossDb", s.latitude AS lat, s.longitude AS lon
       FROM radios r JOIN nodes n ON n.id = r.node_id JOIN sites s ON s.id = n.site_id ORDER BY r.node_id, r.id`,
    { type: QueryTypes.SELECT },
  );
}

/** The newest survey of each node. */
async function latestSurveys(sequelize: Sequelize, nodeIds: number[]): Promise<Map<number, SurveyRow>> {
  const rows = await sequelize.query<SurveyRow>(
    `SELECT DISTINCT ON (node_id) node_id AS "nodeId", id AS "surveyId", created_at AS "createdAt", rows
       FROM site_surveys WHERE node_id = ANY($1::int[]) ORDER BY node_id, created_at DESC, id DESC`,
    { bind: [nodeIds], type: QueryTypes.SELECT },
  );
  return new Map(rows.map((r) => [r.nodeId, r]));
}

const onAir = (r: RadioRow, channel = r.channel): RadioOnAir => ({
  id: r.id,
  nodeId: r.nodeId,
  band: r.band,
  channel,
  channelWidthMHz: r.channelWidthMHz,
  lat: r.lat,
  lon: r.lon,
  eirpDbm: eirpDbm(r.txPowerDbm, r.antennaGainDbi, r.cableLossDb),
});
const round = (x: number, places = 2) => Math.round(x * 10 ** places) / 10 ** places;

/**
 * A recommended channel for every radio the caller plans, node by node so each node's own survey counts;
 * radios outside the plan stay on their channels and count as nearby interference (by distance).
 */
export async function channelPlanFor(sequelize: Sequelize, actor: Actor, region: ChannelRegion, filter: { neighbourhoodId?: number; band?: Band }) {
  const all = await loadRadios(sequelize);
  const planned = all.filter(
    (r) => mayPlanRadio(actor, r) && (!filter.neighbourhoodId || r.neighbourhoodId === filter.neighbourhoodId) && (!filter.band || r.band === filter.band),
  );
  const plannedIds = new Set(planned.map((r) => r.id));
  const nodeIds = [...new Set(planned.map((r) => r.nodeId))];
  const surveys = await latestSurveys(sequelize, nodeIds);
  const assigned = new Map<number, number>();
  const recs = new Map<number, ChannelAssignment>();
  const skipped: { radioId: number; reason: string }[] = [];
  for (const nodeId of nodeIds) {
    const mine = planned.filter((r) => r.nodeId === nodeId);
    const usable = mine.filter((r) => {
      if (r.band === '2.4' && r.channelWidthMHz === 80) {
        skipped.push({ radioId: r.id, reason: '2.4 GHz has no 80 MHz channel; set the radio to 20 or 40 MHz first.' });
        return false;
      }
      return true;
    });
    const nearby = all
      .filter((r) => r.nodeId !== nodeId && (!plannedIds.has(r.id) || assigned.has(r.id)))
      .map((r) => onAir(r, assigned.get(r.id) ?? r.channel));
    const survey = surveys.get(nodeId)?.rows ?? [];
    const radios: RadioToPlan[] = usable.map((r) => ({ ...onAir(r), id: r.id }));
    for (const a of recommendChannels({
      region,
      radios,
      nearby,
      survey: { '2.4': survey.filter((s) => s.band === '2.4'), '5': survey.filter((s) => s.band === '5') },
    })) {
      assigned.set(a.radioId, a.channel);
      recs.set(a.radioId, a);
    }
  }
  const radios = planned.map((r) => {
    const rec = recs.get(r.id);
    return {
      radioId: r.id,
      nodeId: r.nodeId,
      nodeName: r.nodeName,
      neighbourhoodId: r.neighbourhoodId,
      iface: r.iface,
      band: r.band,
      channelWidthMHz: r.channelWidthMHz,
      currentChannel: r.channel,
      recommendedChannel: rec?.channel ?? null,
      centerMHz: rec?.centerMHz ?? null,
      interferenceDbm: rec ? round(mwToDbm(Math.max(rec.interferenceMw, 1e-15))) : null,
      ownNodeOverlapMHz: rec?.ownNodeOverlapMHz ?? null,
      changed: rec ? rec.channel !== r.channel : false,
    };
  });
  const congestion = nodeIds
    .filter((id) => surveys.has(id))
    .map((nodeId) => {
      const s = surveys.get(nodeId)!;
      const byBand = (band: Band) => {
        const rows = s.rows.filter((x) => x.band === band);
        const mw = congestionMwByChannel(band, allowedChannelNumbers(region, band), rows);
        return [...mw].map(([channel, congestionMw]) => ({
          channel,
          congestionDbm: congestionMw > 0 ? round(mwToDbm(congestionMw)) : null,
          networks: rows.filter((x) => x.channel === channel).length,
        }));
      };
      return {
        nodeId,
        nodeName: planned.find((r) => r.nodeId === nodeId)!.nodeName,
        surveyId: s.surveyId,
        surveyedAt: new Date(s.createdAt).toISOString(),
        '2.4': byBand('2.4'),
        '5': byBand('5'),
      };
    });
  return { region, radios, skipped, congestion };
}

const CHANNEL_PLAN_REASON = 'channel plan applied';

/** A block is allowed when every 20 MHz channel it spans is allowed in the region (one rule: validChannels); 14 is 802.11b only. */
function fitsRegion(region: ChannelRegion, band: Band, channel: number, widthMHz: ChannelWidthMHz): boolean {
  return !(band === '2.4' && channel === 14) && validChannels(band, widthMHz, region).includes(channel);
}

/** Applies chosen channels in one transaction: every radio readable and managed by the caller, every channel allowed, each change recorded. */
export async function applyChannelPlan(sequelize: Sequelize, actor: Actor, region: ChannelRegion, assignments: ChannelApplyBody['assignments']) {
  return sequelize.transaction(async (transaction) => {
    const radios = await Radio.findAll({
      where: { id: assignments.map((a) => a.radioId) },
      include: [{ model: Node, as: 'node', where: nodeScope(actor), required: true }],
      lock: { level: transaction.LOCK.UPDATE, of: Radio },
      transaction,
    });
    const out: ChangeRecord[] = [];
    for (const [i, a] of assignments.entries()) {
      const r = radios.find((x) => x.id === a.radioId);
      if (!r) throw NotFound(`Radio ${a.radioId}`);
      authorize(mayManage(actor, r.node!.neighbourhoodId), `Only admins and the operators of its neighbourhood change radio ${r.id}.`);
      if (!fitsRegion(region, r.band, a.channel, r.channelWidthMHz as ChannelWidthMHz)) {
        throw Invalid(`Channel ${a.channel} at ${r.channelWidthMHz} MHz is not allowed on ${r.band} GHz in ${region}; pick one the plan recommends.`, [
          { path: `assignments.${i}.channel`, message: `assignments.${i}.channel ${a.channel} is not allowed for this radio in ${region}` },
        ]);
      }
      if (r.channel === a.channel) continue;
      out.push({
        tableName: 'radios',
        recordId: r.id,
        action: 'update',
        changedBy: actor.id,
        reason: CHANNEL_PLAN_REASON,
        before: { channel: r.channel },
        after: { channel: a.channel },
      });
      await r.update({ channel: a.channel }, { transaction });
    }
    await recordChanges(sequelize, out, transaction);
    return out;
  });
}

export interface ChannelPlanHistoryRow {
  id: string;
  radioId: number;
  before: { channel: number };
  after: { channel: number };
  changedAt: Date;
  changedBy: string | null;
}

/** The last 50 applied channel changes on radios the caller plans (mayManage, written in SQL). */
export async function channelPlanHistory(sequelize: Sequelize, actor: Actor): Promise<ChannelPlanHistoryRow[]> {
  return sequelize.query<ChannelPlanHistoryRow>(
    `SELECT h.id, h.record_id::int AS "radioId", h.before, h.after, h.changed_at AS "changedAt", u.name AS "changedBy"
       FROM change_history h LEFT JOIN users u ON u.id = h.changed_by
       JOIN radios r ON r.id = h.record_id::int JOIN nodes n ON n.id = r.node_id
      WHERE h.table_name = 'radios' AND h.reason = $3 AND ($1 OR n.neighbourhood_id = ANY($2::int[]))
      ORDER BY h.changed_at DESC, h.id DESC LIMIT 50`,
    { bind: [isAdmin(actor), actor.neighbourhoodIds, CHANNEL_PLAN_REASON], type: QueryTypes.SELECT },
  );
}
