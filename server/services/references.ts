import { Op } from 'sequelize';
import { Invalid, NotFound } from '../errors';
import { Link, Neighbourhood, Node, Radio, Site, User } from '../models';
import { type Actor, isAdmin } from '../policies/actor';
import { neighbourhoodScope } from '../policies/neighbourhood';
import { linkScope } from '../policies/link';
import { nodeScope } from '../policies/node';
import { radioNodeInScope } from '../policies/radio';
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

/** A radio, with its node, when the caller may read that node. */
export async function readableRadio(actor: Actor, id: number) {
  const r = await Radio.findOne({ where: { id }, include: [radioNodeInScope(actor)] });
  if (!r) throw NotFound(`Radio ${id}`);
  return r;
}

/** The include a link's scope needs: both ends' radios with their nodes. */
export const linkEnds = () => [
  { model: Radio, as: 'radioA', required: true, include: [{ model: Node, as: 'node', required: true }] },
  { model: Radio, as: 'radioB', required: true, include: [{ model: Node, as: 'node', required: true }] },
];

/** A link, with both ends' radios and nodes, when the caller may read it. */
export async function readableLink(actor: Actor, id: number) {
  const l = await Link.findOne({ where: { [Op.and]: [{ id }, linkScope(actor)] }, include: linkEnds() });
  if (!l) throw NotFound(`Link ${id}`);
  return l;
}

/** The neighbourhoods of a loaded link's ends, for the link predicates. */
export const endsOf = (l: Link) => ({ neighbourhoodAId: l.radioA!.node!.neighbourhoodId, neighbourhoodBId: l.radioB!.node!.neighbourhoodId });

/**
 * People the actor may name as a site's host: for admins every active person; for operators only
 * themselves and the active people who already host a site in their neighbourhoods (whose contact
 * details they see anyway). Anyone else joins through an invitation.
 */
export async function hostCandidates(actor: Actor): Promise<User[]> {
  if (isAdmin(actor))
    return User.findAll({
      where: { active: true },
      order: [
        ['name', 'ASC'],
        ['id', 'ASC'],
      ],
    });
  const hosting = actor.neighbourhoodIds.length
    ? (await Site.findAll({ where: { neighbourhoodId: actor.neighbourhoodIds, hostUserId: { [Op.ne]: null } }, attributes: ['hostUserId'] })).map(
        (s) => s.hostUserId!,
      )
    : [];
  return User.findAll({
    where: { active: true, id: [...new Set([actor.id, ...hosting])] },
    order: [
      ['name', 'ASC'],
      ['id', 'ASC'],
    ],
  });
}

/**
 * A host must be someone the actor may choose (see hostCandidates); hosting is a relation, so any
 * role may host. Keeping a site's current host is always allowed. Every refused id gets the same
 * answer, so the check reveals nothing about who has an account.
 */
export async function assertHost(actor: Actor, hostUserId: number | null | undefined, currentHostUserId: number | null = null) {
  if (hostUserId == null || hostUserId === currentHostUserId) return;
  if ((await hostCandidates(actor)).some((u) => u.id === hostUserId)) return;
  if (isAdmin(actor)) {
    throw Invalid(`Person ${hostUserId} is not an active person who can host.`, [{ path: 'hostUserId', message: 'hostUserId must be an active person' }]);
  }
  throw Invalid('Choose the host among the people who already host a site in your neighbourhoods, or invite the new host by e-mail.', [
    { path: 'hostUserId', message: 'hostUserId must be you or someone who already hosts a site in your neighbourhoods' },
  ]);
}
