import type { NodeDto } from '../../shared/schemas/node';
import type { Node } from '../models';
import type { Actor } from '../policies/actor';
import { nodeAbilities } from '../policies/node';
import { iso } from './common';

export function presentNode(n: Node, actor: Actor): NodeDto {
  return {
    id: n.id,
    name: n.name,
    siteId: n.siteId,
    neighbourhoodId: n.neighbourhoodId,
    hardware: n.hardware ?? null,
    firmware: n.firmware ?? null,
    managementAddress: n.managementAddress ?? null,
    reportIntervalS: n.reportIntervalS,
    isUplink: n.isUplink,
    state: n.state,
    stateSince: iso(n.stateSince),
    lastSeenAt: iso(n.lastSeenAt),
    healthReason: n.healthReason ?? null,
    lastReport: n.lastReport ?? null,
    thresholds: n.thresholds ?? null,
    drift: n.drift ?? [],
    createdAt: iso(n.createdAt)!,
    updatedAt: iso(n.updatedAt)!,
    abilities: nodeAbilities(actor, n),
  };
}
