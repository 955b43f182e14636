import { Op, type Sequelize } from 'sequelize';
import type { z } from 'zod';
import type { NeighbourhoodCreate, neighbourhoodUpdateSchema } from '../../shared/schemas/neighbourhood';
import type { Config } from '../config';
import { Conflict, Invalid } from '../errors';
import { Neighbourhood, Node, OperatorAssignment, Site, User } from '../models';
import type { Actor } from '../policies/actor';
import { nodeScope } from '../policies/node';
import { siteScope } from '../policies/site';
import type { NeighbourhoodCounts } from '../presenters/neighbourhood';
import { recordChange } from './audit';
import { countOf, InUse, uniquely } from './conflicts';
import { domainEvents } from './events';
import { availabilityOf } from './nodeAvailability';

/** Operators, sites and nodes of each neighbourhood, as a lookup by id. */
export async function countsFor(ids: number[]): Promise<(id: number) => NeighbourhoodCounts> {
  const [assignments, sites, nodes] = await Promise.all([
    OperatorAssignment.findAll({ where: { neighbourhoodId: ids } }),
    Site.count({ where: { neighbourhoodId: ids }, group: ['neighbourhoodId'] }),
    Node.count({ where: { neighbourhoodId: ids }, group: ['neighbourhoodId'] }),
  ]);
  const byId = (rows: { neighbourhoodId: unknown; count: number }[], id: number) => rows.find((r) => Number(r.neighbourhoodId) === id)?.count ?? 0;
  return (id: number) => ({
    operatorIds: assignments
      .filter((a) => a.neighbourhoodId === id)
      .map((a) => a.userId)
      .sort((a, b) => a - b),
    siteCount: byId(sites as never, id),
    nodeCount: byId(nodes as never, id),
  });
}

const duplicateName = (name: string) => `A neighbourhood named "${name}" already exists. Choose another name.`;

export const createNeighbourhood = (fields: NeighbourhoodCreate) => uniquely(() => Neighbourhood.create(fields), duplicateName(fields.name));

export async function updateNeighbourhood(n: Neighbourhood, changes: z.output<typeof neighbourhoodUpdateSchema>) {
  const { retired, ...fields } = changes;
  // Retiring again keeps the first date, so the history says when it really stopped.
  const retiredAt = retired === undefined ? undefined : retired ? (n.retiredAt ?? new Date()) : null;
  await uniquely(() => n.update({ ...fields, ...(retiredAt === undefined ? {} : { retiredAt }) }), duplicateName(fields.name ?? n.name));
}

/** Removes an empty neighbourhood; one that still holds sites or nodes is refused with what to move first. */
export async function removeNeighbourhood(n: Neighbourhood) {
  const { siteCount, nodeCount } = (await countsFor([n.id]))(n.id);
  if (siteCount || nodeCount) {
    const held = [siteCount && countOf(siteCount, 'site'), nodeCount && countOf(nodeCount, 'node')].filter(Boolean).join(' and ');
    throw InUse(`This neighbourhood still has ${held}. Move or remove them first.`);
  }
  await n.destroy();
}

/** Replaces the neighbourhood's operators in one recorded transaction; removed and added people hear the change at once. */
export async function assignOperators(n: Neighbourhood, requestedIds: number[]) {
  const userIds = [...new Set(requestedIds)];
  const operators = await User.findAll({ where: { id: userIds, role: 'operator', active: true } });
  const missing = userIds.filter((id) => !operators.some((o) => o.id === id));
  if (missing.length) {
    throw Invalid(`People ${missing.join(', ')} are not active operators.`, [
      { path: 'userIds', message: `userIds ${missing.join(', ')} are not active operators` },
    ]);
  }
  const before = (await countsFor([n.id]))(n.id).operatorIds;
  await Neighbourhood.sequelize!.transaction(async (transaction) => {
    await OperatorAssignment.destroy({ where: { neighbourhoodId: n.id }, transaction });
    await OperatorAssignment.bulkCreate(
      userIds.map((userId) => ({ userId, neighbourhoodId: n.id })),
      { transaction },
    );
    await recordChange(transaction, 'neighbourhoods', n.id, { operatorIds: before }, { operatorIds: [...userIds].sort((a, b) => a - b) }, 'operators assigned');
  });
  // Removed operators stop hearing this neighbourhood's live updates now, added ones start.
  domainEvents.emit('access-changed', { userIds: [...before, ...userIds] });
}

/** What the caller may see in a neighbourhood: its nodes with availability, its operators and its sites' hosts. */
export async function neighbourhoodSummary(config: Config, sequelize: Sequelize, actor: Actor, n: Neighbourhood) {
  const [nodes, sites, assignments] = await Promise.all([
    Node.findAll({ where: { [Op.and]: [{ neighbourhoodId: n.id }, nodeScope(actor)] }, order: [['name', 'ASC']] }),
    Site.findAll({
      where: { [Op.and]: [{ neighbourhoodId: n.id }, siteScope(actor)] },
      include: [{ model: User, as: 'host', attributes: ['id', 'name'] }],
      order: [['name', 'ASC']],
    }),
    OperatorAssignment.findAll({ where: { neighbourhoodId: n.id } }),
  ]);
  const siteNames = new Map(
    (await Site.findAll({ where: { id: [...new Set(nodes.map((x) => x.siteId))] }, attributes: ['id', 'name'] })).map((s) => [s.id, s.name]),
  );
  const operators = await User.findAll({ where: { id: assignments.map((a) => a.userId) }, attributes: ['id', 'name'], order: [['name', 'ASC']] });
  const availability = await availabilityOf(sequelize, nodes, config.now());
  return { nodes, sites, siteNames, operators, availability };
}

/** Moves nodes into the neighbourhood: all or none, one node at a time so each move is in the history. */
export async function moveNodesInto(sequelize: Sequelize, n: Neighbourhood, requestedIds: number[]) {
  if (n.retiredAt) throw Conflict(`${n.name} is retired; bring it back before moving nodes into it.`, 'retired');
  const ids = [...new Set(requestedIds)];
  const nodes = await Node.findAll({ where: { id: ids } });
  const missing = ids.filter((id) => !nodes.some((x) => x.id === id));
  if (missing.length) {
    throw Invalid(`Nodes ${missing.join(', ')} do not exist.`, [{ path: 'nodeIds', message: `nodeIds ${missing.join(', ')} do not exist` }]);
  }
  const moved = await sequelize.transaction(async (transaction) => {
    let count = 0;
    for (const node of nodes) {
      if (node.neighbourhoodId === n.id) continue;
      await node.update({ neighbourhoodId: n.id }, { transaction });
      count++;
    }
    return count;
  });
  return { moved, unchanged: nodes.length - moved };
}
