import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { channelApplySchema, channelPlanQuerySchema, type ChannelApplyBody } from '../../shared/schemas/planningRecords';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { NetworkSettings } from '../models';
import { authorize } from '../policies/authorize';
import { mayPlan } from '../policies/planning';
import { presentChannelApply, presentChannelHistoryEntry } from '../presenters/planning';
import { applyChannelPlan, channelPlanFor, channelPlanHistory } from '../services/channelPlanning';

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
    const { assignments } = res.locals.body as ChannelApplyBody;
    const { region } = await NetworkSettings.findByPk(1, { rejectOnEmpty: true });
    res.json({ data: presentChannelApply(await applyChannelPlan(sequelize, actorOf(req), region, assignments)) });
  });

  router.get('/history', async (req, res) => {
    res.json({ data: (await channelPlanHistory(sequelize, actorOf(req))).map(presentChannelHistoryEntry) });
  });
  return router;
}
