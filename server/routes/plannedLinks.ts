import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { plannedLinkBodySchema, type PlannedLinkBody, type PlannedLinkEnd } from '../../shared/schemas/planningRecords';
import { Invalid } from '../errors';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { type Actor, mayManage } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { mayPlan } from '../policies/planning';
import { presentLink } from '../presenters/link';
import { savePlannedLink, type ResolvedEnd } from '../services/plannedLinks';
import { readableNode, readableRadio } from '../services/references';

const MANAGE = 'Only admins and the operators of its neighbourhood add radios and links at this node.';

async function resolve(actor: Actor, spec: PlannedLinkEnd, side: 'a' | 'b'): Promise<ResolvedEnd> {
  if ('radioId' in spec) {
    const radio = await readableRadio(actor, spec.radioId);
    authorize(mayManage(actor, radio.node!.neighbourhoodId), MANAGE);
    return { radio, nodeId: radio.nodeId, neighbourhoodId: radio.node!.neighbourhoodId, spec };
  }
  const node = await readableNode(actor, spec.nodeId);
  authorize(mayManage(actor, node.neighbourhoodId), MANAGE);
  if (spec.band === '2.4' ? spec.channel > 14 : spec.channel < 32) {
    throw Invalid('The channel does not fit the band.', [
      { path: `${side}.channel`, message: `${side}.channel must be 1–14 on 2.4 GHz or 32 and above on 5 GHz` },
    ]);
  }
  return { radio: null, nodeId: node.id, neighbourhoodId: node.neighbourhoodId, spec };
}

/** Saves a planned link from the link-budget page: new radios where needed and the link, in one transaction. */
export function plannedLinkRoutes(sequelize: Sequelize) {
  const router = Router();
  router.post('/', validate('body', plannedLinkBodySchema), async (req, res) => {
    const actor = actorOf(req);
    authorize(mayPlan(actor), 'Planning is for operators and admins.');
    const body = res.locals.body as PlannedLinkBody;
    const [a, b] = [await resolve(actor, body.a, 'a'), await resolve(actor, body.b, 'b')];
    if (a.nodeId === b.nodeId)
      throw Invalid('Both ends are on the same node; a link joins two different nodes.', [{ path: 'b', message: 'b must be on another node than a' }]);
    const link = await savePlannedLink(sequelize, actor, a, b, body.name);
    const manage = mayManage(actor, a.neighbourhoodId) || mayManage(actor, b.neighbourhoodId);
    res.status(201).json({ data: presentLink(link, { update: manage, delete: manage }) });
  });
  return router;
}
