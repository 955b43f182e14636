import type { Sequelize } from 'sequelize';
import type { NetworkSettingsUpdate } from '../../shared/schemas/planningRecords';
import { NetworkSettings } from '../models';
import type { Actor } from '../policies/actor';
import { recordChanges } from './changeHistory';

const FIELDS = ['name', 'region', 'timeZone', 'addressPool'] as const;
const snapshot = (s: NetworkSettings) => Object.fromEntries(FIELDS.map((f) => [f, s[f] ?? null]));

export const networkSettings = () => NetworkSettings.findByPk(1, { rejectOnEmpty: true });

/** Changes the one settings row under a lock and records before/after in the same transaction. */
export async function updateNetworkSettings(sequelize: Sequelize, actor: Actor, changes: NetworkSettingsUpdate): Promise<NetworkSettings> {
  return sequelize.transaction(async (transaction) => {
    const s = await NetworkSettings.findByPk(1, { rejectOnEmpty: true, transaction, lock: transaction.LOCK.UPDATE });
    const before = snapshot(s);
    await s.update(changes, { transaction });
    await recordChanges(
      sequelize,
      [{ tableName: 'network_settings', recordId: 1, action: 'update', changedBy: actor.id, before, after: snapshot(s) }],
      transaction,
    );
    return s;
  });
}
