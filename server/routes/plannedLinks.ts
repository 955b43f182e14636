import { Router } from 'express';
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { plannedLinkBodySchema, type PlannedLinkBody, type PlannedLinkEnd } from '../../shared/schemas/planningRecords';
import { Invalid } from '../errors';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { Link, Radio } from '../models';
import { type Actor, mayManage } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { mayPlan } from '../policies/planning';
import { presentLink } from '../presenters/link';
import { recordChanges, type ChangeRecord } from '../services/changeHistory';
import { uniquely } from '../services/conflicts';
import { readableNode, readableRadio } from '../services/references';

const MANAGE = 'Only admins and the operators of its neighbourhood add radios and links at this node.';

/** The first wlanN the node does not use yet. */
async function freeIface(nodeId: number, transaction: Transaction): Promise<string> {
  const used = new Set((await Radio.findAll({ where: { nodeId }, attributes: ['iface'], transaction })).map((r) => r.iface));
  let n = 0;
  while (used.has(`wlan${n}`)) n++;
  return `wlan${n}`;
}

interface ResolvedEnd { radio: Radio | null; nodeId: number; neighbourhoodId: number; spec: PlannedLinkEnd }

async function resolve(actor: Actor, spec: PlannedLinkEnd, side: 'a' | 'b'): Promise<ResolvedEnd> {
  if ('radioId' in spec) {
    const radio = await readableRadio(actor, spec.radioId);
    authorize(mayManage(actor, radio.node!.neighbourhoodId), MANAGE);
    return { radio, nodeId: radio.nodeId, neighbourhoodId: radio.node!.neighbourhoodId, spec };
  }
  const node = await readableNode(actor, spec.nodeId);
  authorize(mayManage(actor, node.neighbourhoodId), MANAGE);
  if (spec.band === '2.4' ? spec.channel > 14 : spec.channel < 32) {
    throw Invalid('The channel does not fit the band.', [{ path: `${side}.channel`, message: `${side}.channel must be 1–14 on 2.4 GHz or 32 and above on 5 GHz` }]);
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
    if (a.nodeId === b.nodeId) throw Invalid('Both ends are on the same node; a link joins two different nodes.', [{ path: 'b', message: 'b must be on another node than a' }]);
    const link = await sequelize.transaction(async (transaction) => {
      const changes: ChangeRecord[] = [];
      const radioFor = async (end: ResolvedEnd) => {
        if (end.radio) return end.radio;
        const { nodeId, ...spec } = end.spec as Exclude<PlannedLinkEnd, { radioId: number }>;
        const radio = await Radio.create({ nodeId, ...spec, iface: await freeIface(nodeId, transaction), encryption: 'wpa2-ccmp' }, { transaction });
        changes.push({ tableName: 'radios', recordId: radio.id, action: 'create', changedBy: actor.id, reason: 'saved from the link budget', before: null, after: { nodeId, iface: radio.iface, ...spec } });
        return radio;
      };
      const ra = await radioFor(a);
      const rb = await radioFor(b);
      const name = body.name ?? (await defaultName(sequelize, a.nodeId, b.nodeId, transaction));
      const l = await uniquely(() => Link.create({ radioAId: ra.id, radioBId: rb.id, status: 'planned', name }, { transaction }),
        `Radios ${ra.id} and ${rb.id} are already linked. Change that link instead of adding another.`);
      changes.push({ tableName: 'links', recordId: l.id, action: 'create', changedBy: actor.id, reason: 'saved from the link budget', before: null, after: { radioAId: ra.id, radioBId: rb.id, status: 'planned', name } });
      await recordChanges(sequelize, changes, transaction);
      l.radioA = ra;
      l.radioB = rb;
      return l;
    });
    const manage = mayManage(actor, a.neighbourhoodId) || mayManage(actor, b.neighbourhoodId);
    res.status(201).json({ data: presentLink(link, { update: manage, delete: manage }) });
  });
  return router;
}

async function defaultName(sequelize: Sequelize, nodeAId: number, nodeBId: number, transaction: Transaction): Promise<string> {
  const rows = await sequelize.query<{ id: number; name: string }>('SELECT n.id, s.name FROM nodes n JOIN sites s ON s.id = n.site_id WHERE n.id IN ($1, $2)', { bind: [nodeAId, nodeBId], type: QueryTypes.SELECT, transaction });
  const label = (id: number) => rows.find((r) => r.id === id)?.name ?? `node ${id}`;
  return `${label(nodeAId)} – ${label(nodeBId)} (planned)`.slice(0, 120);
}
