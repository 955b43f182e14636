import { readableLink, readableNeighbourhood, readableNode, readableRadio, readableSite } from '../services/references';
import { type Actor, isAdmin } from './actor';

/** The whole trail, and records that no longer exist, are for admins only. */
export const mayReadWholeHistory = isAdmin;

/**
 * A record's history is readable by whoever may read the record now (its scope decides, 404 otherwise).
 * Links: operators of a neighbourhood either end is in. People: admins, and each person their own.
 */
export async function assertHistoryReadable(actor: Actor, table: string, id: number): Promise<boolean> {
  if (isAdmin(actor)) return true;
  const readable = async (check: () => Promise<unknown>) =>
    check().then(
      () => true,
      () => false,
    );
  switch (table) {
    case 'sites':
      return readable(() => readableSite(actor, id));
    case 'nodes':
      return readable(() => readableNode(actor, id));
    case 'radios':
      return readable(() => readableRadio(actor, id));
    case 'neighbourhoods':
      return readable(() => readableNeighbourhood(actor, id));
    case 'users':
      return actor.id === id;
    case 'links':
      return readable(() => readableLink(actor, id));
    default:
      return false;
  }
}
