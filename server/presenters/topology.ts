import { NODE_STATES, type NodeState } from '../../shared/enums';
import type { DiscoveredLinkDto, TopologyDto, TopologyLinkDto, TopologyNeighbourhoodDto, TopologyNodeDto } from '../../shared/schemas/topology';
import type { Actor } from '../policies/actor';
import { mayAddLink } from '../policies/link';
import type { NeighbourhoodStateRow, TopologyNodeRow, TopologyView } from '../services/topologyView';
import { iso } from './common';

const presentNode = (n: TopologyNodeRow): TopologyNodeDto => ({
  id: n.id,
  name: n.name,
  siteId: n.siteId,
  siteName: n.siteName,
  neighbourhoodId: n.neighbourhoodId,
  latitude: n.latitude,
  longitude: n.longitude,
  state: n.state,
  isUplink: n.isUplink,
  lastSeenAt: iso(n.lastSeenAt),
  openOutageId: n.openOutageId,
  strandedBy: n.strandedBy,
  blastNodeCount: n.blastNodeCount,
});

const presentLink = (l: TopologyView['links'][number]): TopologyLinkDto => ({
  id: l.id,
  name: l.name,
  status: l.status,
  nodeAId: l.nodeAId,
  nodeBId: l.nodeBId,
  distanceKm: l.distanceKm,
  predictedSignalDbm: l.predictedSignalDbm,
  fadeMarginDb: l.fadeMarginDb,
  expectedRateMbps: l.expectedRateMbps,
  measuredSignalDbm: l.measuredSignalDbm,
  observed: l.observed,
  observedSignalDbm: l.observedSignalDbm,
  lastObservedAt: l.lastObservedAt,
  plannedButSilent: l.plannedButSilent,
});

/** The map's "add to the inventory" shows only for those who may add a link between the two radios. */
const presentDiscovered = (actor: Actor, d: TopologyView['discoveredLinks'][number]): DiscoveredLinkDto => ({
  nodeAId: d.nodeAId,
  nodeBId: d.nodeBId,
  radioAId: d.radioAId,
  radioBId: d.radioBId,
  signalDbm: d.signalDbm,
  lastSeenAt: d.lastSeenAt,
  abilities: { add: mayAddLink(actor, d) },
});

export const presentTopology = (actor: Actor, t: TopologyView): TopologyDto => ({
  nodes: t.nodes.map(presentNode),
  links: t.links.map(presentLink),
  discoveredLinks: t.discoveredLinks.map((d) => presentDiscovered(actor, d)),
  radioMoves: t.radioMoves,
});

/** One entry per neighbourhood, every state counted (0 when absent), centre weighted by each state's node count. */
export function presentNeighbourhoodStates(rows: NeighbourhoodStateRow[]): TopologyNeighbourhoodDto[] {
  const byHood = new Map<number, TopologyNeighbourhoodDto>();
  for (const r of rows) {
    let hood = byHood.get(r.neighbourhoodId);
    if (!hood) {
      const counts = Object.fromEntries(NODE_STATES.map((s) => [s, 0])) as Record<NodeState, number>;
      hood = { neighbourhoodId: r.neighbourhoodId, name: r.name, total: 0, counts, latitude: 0, longitude: 0 };
      byHood.set(r.neighbourhoodId, hood);
    }
    hood.counts[r.state] += r.count;
    hood.latitude += r.latitude * r.count;
    hood.longitude += r.longitude * r.count;
    hood.total += r.count;
  }
  return [...byHood.values()].map((h) => ({ ...h, latitude: h.latitude / h.total, longitude: h.longitude / h.total }));
}
