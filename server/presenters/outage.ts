import type { BlastRadiusDto, OutageDto } from '../../shared/schemas/outage';
import type { Outage } from '../models';
import { type Actor, isHostOfNode, mayManage } from '../policies/actor';
import { iso } from './common';

const NO_BLAST: BlastRadiusDto = { nodeCount: 0, neighbourhoodIds: [], clients: 0, nodeIds: [] };

export function presentOutage(o: Outage, actor: Actor, now: Date, blast?: BlastRadiusDto): OutageDto {
  const node = o.node!;
  const manage = mayManage(actor, node.neighbourhoodId);
  return {
    id: o.id,
    nodeId: o.nodeId,
    nodeName: node.name,
    neighbourhoodId: node.neighbourhoodId,
    startedAt: iso(o.startedAt)!,
    endedAt: iso(o.endedAt),
    durationS: Math.max(0, Math.round(((o.endedAt ?? now).getTime() - o.startedAt.getTime()) / 1000)),
    acknowledgedAt: iso(o.acknowledgedAt),
    acknowledgedBy: o.acknowledger ? { id: o.acknowledger.id, name: o.acknowledger.name } : null,
    notes: o.notes ?? null,
    blastRadius: blast ?? { ...NO_BLAST, nodeCount: o.blastNodeCount ?? 0, clients: o.blastClients ?? 0 },
    abilities: { acknowledge: manage && !o.acknowledgedAt && !o.endedAt, annotate: manage, recordHostStep: manage || isHostOfNode(actor, node) },
  };
}
