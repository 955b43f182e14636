import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { z } from 'zod';
import { maintenanceWindowCreateSchema } from '../../shared/schemas/alerts';
import { idSchema } from '../../shared/schemas/common';
import type { Config } from '../config';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { authorize } from '../policies/authorize';
import { mayAnnounceMaintenance } from '../policies/maintenance';
import { presentMaintenanceWindow, presentMaintenanceWindows } from '../presenters/alerts';
import { announceMaintenance, cancelMaintenance, findWindow, windowsOf } from '../services/maintenanceWindows';
import { readableNode } from '../services/references';

const nodeParams = z.object({ id: idSchema });
const windowParams = z.object({ id: idSchema, windowId: idSchema });
const NOT_YOURS = 'Only admins, the operators of its neighbourhood and the host of its site announce maintenance for this node.';

/** Announced maintenance for one node: while a window is open the node shows `maintenance` and no outage mail goes out. */
export function maintenanceWindowRoutes(config: Config, sequelize: Sequelize) {
  const router = Router({ mergeParams: true });

  router.get('/', validate('params', nodeParams), async (req, res) => {
    const actor = actorOf(req);
    const node = await readableNode(actor, res.locals.params.id);
    const may = mayAnnounceMaintenance(actor, node);
    const now = config.now();
    res.json(presentMaintenanceWindows(await windowsOf(node.id), now, may));
  });

  router.post('/', validate('params', nodeParams), validate('body', maintenanceWindowCreateSchema), async (req, res) => {
    const actor = actorOf(req);
    const node = await readableNode(actor, res.locals.params.id);
    authorize(mayAnnounceMaintenance(actor, node), NOT_YOURS);
    const now = config.now();
    const window = await announceMaintenance(sequelize, config, node.id, actor.id, res.locals.body, now);
    res.status(201).json({ data: presentMaintenanceWindow(window, now, true) });
  });

  router.delete('/:windowId', validate('params', windowParams), async (req, res) => {
    const actor = actorOf(req);
    const node = await readableNode(actor, res.locals.params.id);
    const window = await findWindow(node.id, res.locals.params.windowId);
    authorize(mayAnnounceMaintenance(actor, node), NOT_YOURS);
    await cancelMaintenance(sequelize, config, window, config.now());
    res.status(204).end();
  });

  return router;
}
