import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { PlannedLinkBody, PlannedLinkEnd } from '../../shared/schemas/planningRecords';
import { Link, Radio } from '../models';
import type { Actor } from '../policies/actor';
import { recordChanges, type ChangeRecord } from './changeHistory';
import { uniquely } from './conflicts';

/** One end of a planned link after the caller's access was checked: an existing radio, or a node that gets a new one. */
export interface ResolvedEnd {
  radio: Radio | null;
  nodeId: number;
  neighbourhoodId: number;
  spec: PlannedLinkEnd;
}

const REASON = 'saved from the link budget';

/** The first wlanN the node does not use yet. */
async function freeIface(nodeId: number, transaction: Transaction): Promise<string> {
  const used = new Set((await Radio.findAll({ where: { nodeId }, attributes: ['iface'], transaction })).map((r) => r.iface));
  let n = 0;
  while (used.has(`wlan${n}`)) n++;
  return `wlan${n}`;
}

async function defaultName(sequelize: Sequelize, nodeAId: number, nodeBId: number, transaction: Transaction): Promise<string> {
  const rows = await sequelize.query<{ id: number; name: string }>('SELECT n.id, s.name FROM nodes n JOIN sites s ON s.id = n.site_id WHERE n.id IN ($1, $2)', {
    bind: [nodeAId, nodeBId],
    type: QueryTypes.SELECT,
    transaction,
  });
  const label = (id: number) => rows.find((r) => r.id === id)?.name ?? `node ${id}`;
  return `${label(nodeAId)} – ${label(nodeBId)} (planned)`.slice(0, 120);
}

/** New radios where needed and the planned link, in one recorded transaction. */
export async function savePlannedLink(sequelize: Sequelize, actor: Actor, a: ResolvedEnd, b: ResolvedEnd, name: PlannedLinkBody['name']): Promise<Link> {
  return sequelize.transaction(async (transaction) => {
    const changes: ChangeRecord[] = [];
    const radioFor = async (end: ResolvedEnd) => {
      if (end.radio) return end.radio;
      const { nodeId, ...spec } = end.spec as Exclude<PlannedLinkEnd, { radioId: number }>;
      const radio = await Radio.create({ nodeId, ...spec, iface: await freeIface(nodeId, transaction), encryption: 'wpa2-ccmp' }, { transaction });
      changes.push({
        tableName: 'radios',
        recordId: radio.id,
        action: 'create',
        changedBy: actor.id,
        reason: REASON,
        before: null,
        after: { nodeId, iface: radio.iface, ...spec },
      });
      return radio;
    };
    const ra = await radioFor(a);
    const rb = await radioFor(b);
    const linkName = name ?? (await defaultName(sequelize, a.nodeId, b.nodeId, transaction));
    const l = await uniquely(
      () => Link.create({ radioAId: ra.id, radioBId: rb.id, status: 'planned', name: linkName }, { transaction }),
      `Radios ${ra.id} and ${rb.id} are already linked. Change that link instead of adding another.`,
    );
    changes.push({
      tableName: 'links',
      recordId: l.id,
      action: 'create',
      changedBy: actor.id,
      reason: REASON,
      before: null,
      after: { radioAId: ra.id, radioBId: rb.id, status: 'planned', name: linkName },
    });
    await recordChanges(sequelize, changes, transaction);
    l.radioA = ra;
    l.radioB = rb;
    return l;
  });
}
