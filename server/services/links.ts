import { Op, type WhereOptions } from 'sequelize';
import type { z } from 'zod';
import type { LinkCreate, linkListQuerySchema, linkUpdateSchema } from '../../shared/schemas/link';
import { Link } from '../models';
import type { Actor } from '../policies/actor';
import { linkScope } from '../policies/link';
import { uniquely } from './conflicts';
import { listPage } from './listing';
import { linkEnds, readableLink } from './references';

/** One page of the links the caller may read, filtered by status and by a node at either end. */
export function listLinks(actor: Actor, q: z.infer<typeof linkListQuerySchema>) {
  const where: WhereOptions[] = [linkScope(actor)];
  if (q.status) where.push({ status: q.status });
  if (q.nodeId) where.push({ [Op.or]: [{ '$radioA.node_id$': q.nodeId }, { '$radioB.node_id$': q.nodeId }] });
  return listPage(Link, q, {
    where: { [Op.and]: where },
    sortable: ['name', 'status', 'createdAt', 'id'],
    searchable: ['name'],
    defaultSort: 'id',
    include: linkEnds(),
  });
}

/** Adds a link (409 when the two radios are already linked) and answers it with both ends loaded. */
export async function createLink(actor: Actor, body: LinkCreate) {
  const taken = `Radios ${body.radioAId} and ${body.radioBId} are already linked. Change that link instead of adding another.`;
  const link = await uniquely(() => Link.create(body), taken);
  return readableLink(actor, link.id);
}

export const updateLink = (link: Link, body: z.infer<typeof linkUpdateSchema>) => link.update(body);
export const removeLink = (link: Link) => link.destroy();
