import { Op } from 'sequelize';
import { Invalid, NotFound } from '../errors';
import { Neighbourhood, Node, Site, User } from '../models';
import type { Actor } from '../policies/actor';
import { neighbourhoodScope } from '../policies/neighbourhood';
import { nodeScope } from '../policies/node';
import { siteScope } from '../policies/site';

/** Records named in a body must be readable by the caller; otherwise they "do not exist" for them. */
export async function readableNeighbourhood(actor: Actor, id: number) {
  const n = await Neighbourhood.findOne({ where: { [Op.and]: [{ id }, neighbourhoodScope(actor)] } });
  if (!n) throw NotFound(`Neighbourhood ${id}`);
  return n;
}

export async function readableSite(actor: Actor, id: number) {
  const s = await Site.findOne({ where: { [Op.and]: [{ id }, siteScope(actor)] }, include: [{ model: User, as: 'host' }] });
  if (!s) throw NotFound(`Site ${id}`);
  return s;
}

export async function readableNode(actor: Actor, id: number) {
  const n = await Node.findOne({ where: { [Op.and]: [{ id }, nodeScope(actor)] } });
  if (!n) throw NotFound(`Node ${id}`);
  return n;
}

/** A host must be an active person; hosting is a relation, so any role may host. */
export async function assertHost(hostUserId: number | null | undefined) {
  if (hostUserId == null) return;
  const host = await User.findOne({ where: { id: hostUserId, active: true } });
  if (!host) throw Invalid(`Person ${hostUserId} is not an active person who can host.`, [{ path: 'hostUserId', message: 'hostUserId must be an active person' }]);
}
