import type { Node } from '../models';
import { type Actor, isHostOfNode, mayManage } from './actor';

/** Admins, the operators of the node's neighbourhood, and the host of its site announce or cancel maintenance. */
export const mayAnnounceMaintenance = (a: Actor, node: Pick<Node, 'neighbourhoodId' | 'siteId'>) => mayManage(a, node.neighbourhoodId) || isHostOfNode(a, node);
