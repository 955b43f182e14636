import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { networkSettingsUpdateSchema, type NetworkSettingsDto } from '../../shared/schemas/planningRecords';
import { requireRole } from '../middlewares/requireRole';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { NetworkSettings } from '../models';
import { isAdmin, type Actor } from '../policies/actor';
import { iso } from '../presenters/common';
import { recordChanges } from '../services/changeHistory';

const FIELDS = ['name', 'region', 'timeZone', 'addressPool'] as const;

function present(s: NetworkSettings, actor: Actor): NetworkSettingsDto {
  return { name: s.name, region: s.region, timeZone: s.timeZone, addressPool: s.addressPool ?? null, updatedAt: iso(s.updatedAt)!, abilities: { update: isAdmin(actor) } };
}
const snapshot = (s: NetworkSettings) => Object.fromEntries(FIELDS.map((f) => [f, s[f] ?? null]));

/** The network's region, time zone and address pool: anyone signed in reads them, admins change them. */
export function settingsRoutes(sequelize: Sequelize) {
  const router = Router();
  router.get('/network', async (req, res) => {
    const settings = await NetworkSettings.findByPk(1, { rejectOnEmpty: true });
    res.json({ data: present(settings, actorOf(req)) });
  });
  router.patch('/network', requireRole(isAdmin, 'Only admins change the network settings.'), validate('body', networkSettingsUpdateSchema), async (req, res) => {
    const actor = actorOf(req);
    const settings = await sequelize.transaction(async (transaction) => {
      const s = await NetworkSettings.findByPk(1, { rejectOnEmpty: true, transaction, lock: transaction.LOCK.UPDATE });
      const before = snapshot(s);
      await s.update(res.locals.body, { transaction });
      await recordChanges(sequelize, [{ tableName: 'network_settings', recordId: 1, action: 'update', changedBy: actor.id, before, after: snapshot(s) }], transaction);
      return s;
    });
    res.json({ data: present(settings, actor) });
  });
  return router;
}
