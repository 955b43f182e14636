import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { networkSettingsUpdateSchema } from '../../shared/schemas/planningRecords';
import { requireRole } from '../middlewares/requireRole';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { isAdmin } from '../policies/actor';
import { presentNetworkSettings } from '../presenters/settings';
import { networkSettings, updateNetworkSettings } from '../services/networkSettings';

/** The network's region, time zone and address pool: anyone signed in reads them, admins change them. */
export function settingsRoutes(sequelize: Sequelize) {
  const router = Router();
  router.get('/network', async (req, res) => {
    res.json({ data: presentNetworkSettings(await networkSettings(), actorOf(req)) });
  });
  router.patch(
    '/network',
    requireRole(isAdmin, 'Only admins change the network settings.'),
    validate('body', networkSettingsUpdateSchema),
    async (req, res) => {
      const actor = actorOf(req);
      res.json({ data: presentNetworkSettings(await updateNetworkSettings(sequelize, actor, res.locals.body), actor) });
    },
  );
  return router;
}
