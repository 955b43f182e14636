import type { DiscoveredLinkDto, TopologyDto, TopologyLinkDto, TopologyNodeDto } from '../../shared/schemas/topology';
import type { Actor } from '../policies/actor';
import { mayAddLink } from '../policies/link';
import type { TopologyNodeRow, TopologyView } from '../services/topologyView';
import { iso } from './common';

const presentNode = (n: TopologyNodeRow): TopologyNodeDto => ({
  id: n.id, name: n.name, siteId: n.siteId, siteName: n.siteName, neighbourhoodId: n.neighbourhoodId, latitude: n.latitude, longitude: n.longitude,
  state: n.state, isUplink: n.isUplink, lastSeenAt: iso(n.lastSeenAt), openOutageId: n.openOutageId, strandedBy: n.strandedBy, blastNodeCount: n.blastNodeCount,
});

const presentLink = (l: TopologyView['links'][number]): TopologyLinkDto => ({
  id: l.id, name: l.name, status: l.status, nodeAId: l.nodeAId, nodeBId: l.nodeBId, distanceKm: l.distanceKm, predictedSignalDbm: l.predictedSignalDbm,
  fadeMarginDb: l.fadeMarginDb, expectedRateMbps: l.expectedRateMbps, measuredSignalDbm: l.measuredSignalDbm,
  observed: l.observed, observedSignalDbm: l.observedSignalDbm, lastObservedAt: l.lastObservedAt, plannedButSilent: l.plannedButSilent,
});

/** The map's "add to the inventory" shows only for those who may add a link between the two radios. */
const presentDiscovered = (actor: Actor, d: TopologyView['discoveredLinks'][number]): DiscoveredLinkDto => ({
  nodeAId: d.nodeAId, nodeBId: d.nodeBId, radioAId: d.radioAId, radioBId: d.radioBId, signalDbm: d.signalDbm, lastSeenAt: d.lastSeenAt,
  abilities: { add: mayAddLink(actor, d) },
});

export const presentTopology = (actor: Actor, t: TopologyView): TopologyDto => ({
  nodes: t.nodes.map(presentNode),
  links: t.links.map(presentLink),
  discoveredLinks: t.discoveredLinks.map((d) => presentDiscovered(actor, d)),
  radioMoves: t.radioMoves,
});
