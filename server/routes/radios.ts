import { Router } from 'express';

import type { Band } from '../../shared/enums';
import { channelProblem } from '../../shared/radio/channels';
import { idParamsSchema } from '../../shared/schemas/common';
import { radioCreateSchema, radioListQuerySchema, radioUpdateSchema } from '../../shared/schemas/radio';
import { Invalid, NotFound } from '../errors';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { Node, Radio } from '../models';
import { type Actor, isAdmin, mayManage } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { nodeScope } from '../policies/node';
import { presentRadio } from '../presenters/radio';
import { uniquely } from '../services/conflicts';
import { filters, listPage } from '../services/listing';
import { readableNode } from '../services/references';

const MANAGE = 'Only admins and the operators of its neighbourhood change this radio.';
const nodeInScope = (actor: Actor) => ({ model: Node, as: 'node', where: nodeScope(actor), required: true });

export async function readableRadio(actor: Actor, id: number) {
  const r = await Radio.findOne({ where: { id }, include: [nodeInScope(actor)] });
  if (!r) throw NotFound(`Radio ${id}`);
  return r;
}

/** Band, channel and width must agree after a partial update too (one rule: shared/radio/channels.ts). */
function checkBandChannel(band: Band, channel: number, channelWidthMHz: number) {
  const problem = channelProblem(band, channel, channelWidthMHz);
  if (!problem) return;
  const sentence = problem.field === 'channel' ? 'The channel does not fit the band.' : 'The channel width does not fit the band.';
  const message = `${problem.field} ${problem.message}`;
  throw Invalid(problem.message.startsWith('must be 1–14') ? sentence : `${sentence} ${message[0].toUpperCase()}${message.slice(1)}.`, [{ path: problem.field, message }]);
}

const duplicateIface = (iface: string) => `That node already has a radio on interface ${iface}. Choose another interface name.`;

export function radioRoutes() {
  const router = Router();

  router.get('/', validate('query', radioListQuerySchema), async (req, res) => {
    const actor = actorOf(req);
    const q = res.locals.query;
    const { rows, pagination } = await listPage(Radio, q, {
      where: filters({ nodeId: q.nodeId, band: q.band, role: q.role }),
      sortable: ['iface', 'nodeId', 'band', 'channel', 'role', 'encryption', 'txPowerDbm', 'createdAt', 'id'],
      searchable: ['ssid', 'iface'],
      defaultSort: 'id',
      include: [nodeInScope(actor)],
    });
    res.json({
      data: rows.map((r) => presentRadio(r, r.node!.neighbourhoodId, actor)),
      pagination,
      abilities: { create: isAdmin(actor) || actor.neighbourhoodIds.length > 0 },
    });
  });

  router.post('/', validate('body', radioCreateSchema), async (req, res) => {
    const actor = actorOf(req);
    const body = res.locals.body;
    const node = await readableNode(actor, body.nodeId);
    authorize(mayManage(actor, node.neighbourhoodId), 'Only admins and the operators of its neighbourhood add radios to this node.');
    const radio = await uniquely(() => Radio.create(body), duplicateIface(body.iface));
    res.status(201).json({ data: presentRadio(radio, node.neighbourhoodId, actor) });
  });

  router.get('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const r = await readableRadio(actor, res.locals.params.id);
    res.json({ data: presentRadio(r, r.node!.neighbourhoodId, actor) });
  });

  router.patch('/:id', validate('params', idParamsSchema), validate('body', radioUpdateSchema), async (req, res) => {
    const actor = actorOf(req);
    const r = await readableRadio(actor, res.locals.params.id);
    authorize(mayManage(actor, r.node!.neighbourhoodId), MANAGE);
    const body = res.locals.body;
    if (body.nodeId !== undefined && body.nodeId !== r.nodeId) {
      const target = await readableNode(actor, body.nodeId);
      authorize(mayManage(actor, target.neighbourhoodId), 'You cannot move a radio to a node you do not operate.');
    }
    checkBandChannel(body.band ?? r.band, body.channel ?? r.channel, body.channelWidthMHz ?? r.channelWidthMHz);
    await uniquely(() => r.update(body), duplicateIface(body.iface ?? r.iface));
    const fresh = await readableRadio(actor, r.id);
    res.json({ data: presentRadio(fresh, fresh.node!.neighbourhoodId, actor) });
  });

  router.delete('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const r = await readableRadio(actor, res.locals.params.id);
    authorize(mayManage(actor, r.node!.neighbourhoodId), MANAGE);
    await r.destroy();
    res.status(204).end();
  });

  return router;
}

