import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { z } from 'zod';
import { maintenanceWindowCreateSchema } from '../../shared/schemas/alerts';
import { idSchema } from '../../shared/schemas/common';
import type { Config } from '../config';
import { Invalid, NotFound } from '../errors';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { MaintenanceWindow, Node, User } from '../models';
import type { Actor } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { mayAnnounceMaintenance } from '../policies/maintenance';
import { nodeScope } from '../policies/node';
import { presentMaintenanceWindow } from '../presenters/alerts';
import { writeDueOfflineAlerts } from '../services/alerts';
import { applyMaintenanceWindows } from '../services/maintenance';
import { emitTransition } from '../services/nodeHealth';

const nodeParams = z.object({ id: idSchema });
const windowParams = z.object({ id: idSchema, windowId: idSchema });
const NOT_YOURS = 'Only admins, the operators of its neighbourhood and the host of its site announce maintenance for this node.';

async function readableNode(actor: Actor, id: number) {
  const node = await Node.findOne({ where: { id, ...nodeScope(actor) } });
  if (!node) throw NotFound(`Node ${id}`);
  return node;
}

/** Puts the node into or out of maintenance now if a window just opened or closed (mailing an outage that opens), and tells open consoles. */
async function applyNow(sequelize: Sequelize, config: Config, nodeId: number, now: Date) {
  const events = await sequelize.transaction(async (t) => {
    const moved = await applyMaintenanceWindows(sequelize, config, now, t, nodeId);
    await writeDueOfflineAlerts(sequelize, config, now, t);
    return moved;
  });
  events.forEach(emitTransition);
}

/** Announced maintenance for one node: while a window is open the node shows `maintenance` and no outage mail goes out. */
export function maintenanceWindowRoutes(config: Config, sequelize: Sequelize) {
  const router = Router({ mergeParams: true });

  router.get('/', validate('params', nodeParams), async (req, res) => {
    const actor = actorOf(req);
    const node = await readableNode(actor, res.locals.params.id);
    const windows = await MaintenanceWindow.findAll({
      where: { nodeId: node.id },
      include: [{ model: User, as: 'creator', required: false }],
      order: [['startsAt', 'DESC'], ['id', 'DESC']],
      limit: 100,
    });
    const may = mayAnnounceMaintenance(actor, node);
    res.json({ data: windows.map((w) => presentMaintenanceWindow(w, config.now(), may)), abilities: { create: may } });
  });

  router.post('/', validate('params', nodeParams), validate('body', maintenanceWindowCreateSchema), async (req, res) => {
    const actor = actorOf(req);
    const node = await readableNode(actor, res.locals.params.id);
    authorize(mayAnnounceMaintenance(actor, node), NOT_YOURS);
    const body = res.locals.body;
    const now = config.now();
    if (new Date(body.endsAt) <= now) {
      throw Invalid('The request body is invalid: endsAt must be in the future.', [{ path: 'endsAt', message: 'endsAt must be in the future' }]);
    }
    const created = await MaintenanceWindow.create({ nodeId: node.id, startsAt: new Date(body.startsAt), endsAt: new Date(body.endsAt), reason: body.reason || null, createdBy: actor.id });
    await applyNow(sequelize, config, node.id, now);
    const window = await MaintenanceWindow.findByPk(created.id, { include: [{ model: User, as: 'creator', required: false }] });
    res.status(201).json({ data: presentMaintenanceWindow(window!, now, true) });
  });

  router.delete('/:windowId', validate('params', windowParams), async (req, res) => {
    const actor = actorOf(req);
    const node = await readableNode(actor, res.locals.params.id);
    const window = await MaintenanceWindow.findOne({ where: { id: res.locals.params.windowId, nodeId: node.id } });
    if (!window) throw NotFound(`Maintenance window ${res.locals.params.windowId} of node ${node.id}`);
    authorize(mayAnnounceMaintenance(actor, node), NOT_YOURS);
    const now = config.now();
    if (!window.cancelledAt && window.endsAt > now) {
      await window.update({ cancelledAt: now });
      await applyNow(sequelize, config, node.id, now);
    }
    res.status(204).end();
  });

  return router;
}
