import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { linkBudgetWithTerrain } from '../services/linkPrediction';
import { listChannels, validChannels } from '../../shared/radio/channels';
import { Invalid } from '../errors';
import { computeRegulatory } from '../../shared/radio/regulatory';
import { planAddressPool } from '../../shared/addressing/poolPlan';
import { addressPlanBodySchema, channelsQuerySchema, linkBudgetBodySchema, regulatoryBodySchema } from '../../shared/schemas/planning';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { authorize } from '../policies/authorize';
import { mayPlan } from '../policies/planning';

/** The trade's computations; answers sit at the top level (API.md "Planning computations"). */
export function planningRoutes(sequelize: Sequelize) {
  const router = Router();
  router.use((req, _res, next) => {
    authorize(mayPlan(actorOf(req)), 'Planning is for operators and admins.');
    next();
  });
  router.post('/link-budget', validate('body', linkBudgetBodySchema), async (_req, res) => {
    res.json(await linkBudgetWithTerrain(sequelize, res.locals.body));
  });
  router.post('/regulatory', validate('body', regulatoryBodySchema), (_req, res) => {
    res.json(computeRegulatory(res.locals.body));
  });
  router.get('/channels', validate('query', channelsQuerySchema), (_req, res) => {
    const { region, band, channelWidthMHz } = res.locals.query;
    const all = listChannels(region, band);
    if (channelWidthMHz === undefined) return void res.json(all);
    if (band === '2.4' && channelWidthMHz === 80)
      throw Invalid('2.4 GHz has no 80 MHz channels; ask for 20 or 40.', [
        { path: 'channelWidthMHz', message: 'channelWidthMHz must be 20 or 40 on 2.4 GHz: the band has no 80 MHz channel' },
      ]);
    const ok = new Set(validChannels(band, channelWidthMHz, region));
    res.json({ channels: all.channels.filter((c) => ok.has(c.channel)) });
  });
  router.post('/address-plan', validate('body', addressPlanBodySchema), (_req, res) => {
    res.json(planAddressPool(res.locals.body));
  });
  return router;
}
