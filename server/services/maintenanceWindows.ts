import type { Sequelize } from 'sequelize';
import type { MaintenanceWindowCreate } from '../../shared/schemas/alerts';
import type { Config } from '../config';
import { Invalid, NotFound } from '../errors';
import { MaintenanceWindow, User } from '../models';
import { writeDueOfflineAlerts } from './alerts';
import { applyMaintenanceWindows } from './maintenance';
import { emitTransition } from './nodeHealth';

const withCreator = { include: [{ model: User, as: 'creator', required: false }] };

/** Puts the node into or out of maintenance now if a window just opened or closed (mailing an outage that opens), and tells open consoles. */
async function applyNow(sequelize: Sequelize, config: Config, nodeId: number, now: Date) {
  const events = await sequelize.transaction(async (t) => {
    const moved = await applyMaintenanceWindows(sequelize, config, now, t, nodeId);
    await writeDueOfflineAlerts(sequelize, config, now, t);
    return moved;
  });
  events.forEach(emitTransition);
}

/** The node's 100 newest windows with who announced them. */
export const windowsOf = (nodeId: number) =>
  MaintenanceWindow.findAll({
    where: { nodeId },
    ...withCreator,
    order: [
      ['startsAt', 'DESC'],
      ['id', 'DESC'],
    ],
    limit: 100,
  });

export async function findWindow(nodeId: number, windowId: number) {
  const window = await MaintenanceWindow.findOne({ where: { id: windowId, nodeId } });
  if (!window) throw NotFound(`Maintenance window ${windowId} of node ${nodeId}`);
  return window;
}

/** A window that has not ended yet; the node changes state at once if it is already open. */
export async function announceMaintenance(sequelize: Sequelize, config: Config, nodeId: number, createdBy: number, body: MaintenanceWindowCreate, now: Date) {
  if (new Date(body.endsAt) <= now) {
    throw Invalid('The request body is invalid: endsAt must be in the future.', [{ path: 'endsAt', message: 'endsAt must be in the future' }]);
  }
  const created = await MaintenanceWindow.create({
    nodeId,
    startsAt: new Date(body.startsAt),
    endsAt: new Date(body.endsAt),
    reason: body.reason || null,
    createdBy,
  });
  await applyNow(sequelize, config, nodeId, now);
  return (await MaintenanceWindow.findByPk(created.id, withCreator))!;
}

/** Cancelling a window that is over or already cancelled changes nothing. */
export async function cancelMaintenance(sequelize: Sequelize, config: Config, window: MaintenanceWindow, now: Date) {
  if (window.cancelledAt || window.endsAt <= now) return;
  await window.update({ cancelledAt: now });
  await applyNow(sequelize, config, window.nodeId, now);
}
