import { Router } from 'express';
import { QueryTypes, type Sequelize } from 'sequelize';
import type { Band, ChannelWidthMHz } from '../../shared/enums';
import { validChannels } from '../../shared/radio/channels';
import { channelApplySchema, channelPlanQuerySchema, type ChannelApplyBody } from '../../shared/schemas/planningRecords';
import { Invalid, NotFound } from '../errors';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { NetworkSettings } from '../models';
import { mayManage } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { mayPlan } from '../policies/planning';
import { nodeScope } from '../policies/node';
import { Node, Radio } from '../models';
import { recordChanges } from '../services/changeHistory';
import { channelPlanFor } from '../services/channelPlanning';

/** A block is allowed when every 20 MHz channel it spans is allowed in the region (one rule: validChannels); 14 is 802.11b only. */
function fitsRegion(region: 'US' | 'EU' | 'JP', band: Band, channel: number, widthMHz: ChannelWidthMHz): boolean {
  return !(band === '2.4' && channel === 14) && validChannels(band, widthMHz, region).includes(channel);
}

/** The channel plan: recommendations with surveyed congestion, and applying them in one recorded change. */
export function channelPlanRoutes(sequelize: Sequelize) {
  const router = Router();
  router.use((req, _res, next) => {
    authorize(mayPlan(actorOf(req)), 'Planning is for operators and admins.');
    next();
  });

  router.get('/', validate('query', channelPlanQuerySchema), async (req, res) => {
    const settings = await NetworkSettings.findByPk(1, { rejectOnEmpty: true });
    res.json({ data: await channelPlanFor(sequelize, actorOf(req), settings.region, res.locals.query) });
  });

  router.post('/apply', validate('body', channelApplySchema), async (req, res) => {
    const actor = actorOf(req);
    const { assignments } = res.locals.body as ChannelApplyBody;
    const { region } = await NetworkSettings.findByPk(1, { rejectOnEmpty: true });
    const changes = await sequelize.transaction(async (transaction) => {
      const radios = await Radio.findAll({
        where: { id: assignments.map((a) => a.radioId) },
        include: [{ model: Node, as: 'node', where: nodeScope(actor), required: true }],
        lock: { level: transaction.LOCK.UPDATE, of: Radio }, transaction,
      });
      const out = [];
      for (const [i, a] of assignments.entries()) {
        const r = radios.find((x) => x.id === a.radioId);
        if (!r) throw NotFound(`Radio ${a.radioId}`);
        authorize(mayManage(actor, r.node!.neighbourhoodId), `Only admins and the operators of its neighbourhood change radio ${r.id}.`);
        if (!fitsRegion(region, r.band, a.channel, r.channelWidthMHz as ChannelWidthMHz)) {
          throw Invalid(`Channel ${a.channel} at ${r.channelWidthMHz} MHz is not allowed on ${r.band} GHz in ${region}; pick one the plan recommends.`,
            [{ path: `assignments.${i}.channel`, message: `assignments.${i}.channel ${a.channel} is not allowed for this radio in ${region}` }]);
        }
        if (r.channel === a.channel) continue;
        out.push({ tableName: 'radios', recordId: r.id, action: 'update' as const, changedBy: actor.id, reason: 'channel plan applied', before: { channel: r.channel }, after: { channel: a.channel } });
        await r.update({ channel: a.channel }, { transaction });
      }
      await recordChanges(sequelize, out, transaction);
      return out;
    });
    res.json({ data: { updated: changes.length, changes: changes.map((c) => ({ radioId: Number(c.recordId), before: c.before, after: c.after })) } });
  });

  router.get('/history', async (_req, res) => {
    const rows = await sequelize.query(
      `SELECT h.id, h.record_id::int AS "radioId", h.before, h.after, h.changed_at AS "changedAt", u.name AS "changedBy"
         FROM change_history h LEFT JOIN users u ON u.id = h.changed_by
         JOIN radios r ON r.id = h.record_id::int JOIN nodes n ON n.id = r.node_id
        WHERE h.table_name = 'radios' AND h.reason = 'channel plan applied' AND ($1 OR n.neighbourhood_id = ANY($2::int[]))
        ORDER BY h.changed_at DESC, h.id DESC LIMIT 50`,
      { bind: [actorOf(_req).role === 'admin', actorOf(_req).neighbourhoodIds], type: QueryTypes.SELECT },
    );
    res.json({ data: rows });
  });
  return router;
}
