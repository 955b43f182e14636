import { Op } from 'sequelize';
import { Link, Radio } from '../models';
import { readableNeighbourhood, readableNode, readableSite } from '../services/references';
import { type Actor, isAdmin } from './actor';
import { nodeScope } from './node';

/** The whole trail, and records that no longer exist, are for admins only. */
export const mayReadWholeHistory = isAdmin;

/**
 * A record's history is readable by whoever may read the record now (its scope decides, 404 otherwise).
 * Links: operators of a neighbourhood either end is in. People: admins, and each person their own.
 */
export async function assertHistoryReadable(actor: Actor, table: string, id: number): Promise<boolean> {
  if (isAdmin(actor)) return true;
  const readable = async (check: () => Promise<unknown>) => check().then(() => true, () => false);
  switch (table) {
    case 'sites': return readable(() => readableSite(actor, id));
    case 'nodes': return readable(() => readableNode(actor, id));
    case 'radios': return (await Radio.count({ where: { id }, include: [{ association: 'node', where: nodeScope(actor), required: true }] })) > 0;
    case 'neighbourhoods': return readable(() => readableNeighbourhood(actor, id));
    case 'users': return actor.id === id;
    case 'links': {
      if (actor.role !== 'operator') return false;
      const link = await Link.findByPk(id);
      if (!link) return false;
      const ends = await Radio.findAll({ where: { id: { [Op.in]: [link.radioAId, link.radioBId] } }, include: [{ association: 'node', required: true }] });
      return ends.some((r) => actor.neighbourhoodIds.includes(r.node!.neighbourhoodId));
    }
    default: return false;
  }
}
