import { Node } from '../models';
import type { Actor } from './actor';
import { mayManage } from './actor';
import { mayReadNode, nodeScope } from './node';

/** A radio is readable exactly when its node is (see node.ts); changing it takes managing the node. */
export const mayReadRadio = mayReadNode;

/** The include that scopes a Radio query by its node: `Radio.findAll({ include: [radioNodeInScope(actor)] })`. */
export const radioNodeInScope = (a: Actor) => ({ model: Node, as: 'node', where: nodeScope(a), required: true });

export const radioAbilities = (a: Actor, node: { neighbourhoodId: number }) => {
  const manage = mayManage(a, node.neighbourhoodId);
  return { update: manage, delete: manage };
};
