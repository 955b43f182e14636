// Root cause of a silence: which silent node explains the others. Pure; the clock is passed in.
import type { NodeState } from '../enums';
import { type Graph, type NodePath, pathNodes, reachable } from './paths';

export interface WatchedNode {
  id: number;
  isUplink: boolean;
  state: NodeState;
  lastSeenAtMs: number | null;
  reportIntervalS: number;
  /** Seconds of silence after which the node counts as offline (interval × missed reports). */
  offlineWindowS: number;
}

export interface Topology {
  graph: Graph;
  paths: Map<number, NodePath>;
  /** Nodes joined to an uplink over live links when nothing has failed. */
  liveReach: Set<number>;
}

export type StrandCause = 'outage' | 'partition' | 'maintenance';

export interface Attribution {
  /** Silent nodes whose silence nothing upstream explains: each gets its own outage. */
  roots: number[];
  /** Silent nodes cut off behind `rootNodeId`. */
  stranded: { nodeId: number; rootNodeId: number; cause: StrandCause }[];
  /** Silent nodes whose upstream node has missed a report but is not yet judged: looked at again next check. */
  deferred: number[];
}

/** An upstream node that has missed its last report by half an interval is suspect (common practice, no source). */
const overdue = (u: WatchedNode, nowMs: number) => u.lastSeenAtMs != null && nowMs - u.lastSeenAtMs > 1.5 * u.reportIntervalS * 1000;

/**
 * Attributes this check's newly silent nodes. A silent node is stranded when no live path joins it
 * to a working uplink any more and the first failed node on its path (from the uplink down) went
 * quiet within `windowS` of it: that node is its root. A cut whose first failed node is an uplink
 * (Parapet's own side) is a partition. A silent node with a live path left, or whose upstream went
 * quiet long before or after it, is a root of its own. Nodes with no live path at all are judged alone.
 */
export function attributeSilence(topo: Topology, nodes: Map<number, WatchedNode>, silentIds: number[], nowMs: number, windowS: number): Attribution {
  const windowMs = windowS * 1000;
  const silent = new Set(silentIds);
  const deferred: number[] = [];
  for (const id of [...silent].sort((a, b) => a - b)) {
    const n = nodes.get(id);
    if (!n || n.isUplink) continue;
    const silentAtMs = (n.lastSeenAtMs ?? nowMs) + n.offlineWindowS * 1000;
    if (nowMs >= silentAtMs + windowMs) continue;
    const upstream = pathNodes(topo.paths, id).slice(1);
    if (upstream.some((u) => !silent.has(u) && isReporting(nodes.get(u)) && overdue(nodes.get(u)!, nowMs))) deferred.push(id);
  }
  deferred.forEach((id) => silent.delete(id));

  const down = new Set(silent);
  for (const n of nodes.values()) if (n.state === 'offline' || n.state === 'stranded' || (n.state === 'maintenance' && isQuiet(n, nowMs))) down.add(n.id);
  const reach = reachable(topo.graph, { nodeIds: down, liveOnly: true });

  const roots: number[] = [];
  const stranded: Attribution['stranded'] = [];
  for (const id of [...silent].sort((a, b) => a - b)) {
    const n = nodes.get(id)!;
    if (n.isUplink) {
      stranded.push({ nodeId: id, rootNodeId: id, cause: 'partition' });
      continue;
    }
    const cause = topo.liveReach.has(id) && !hasLiveNeighbourIn(topo.graph, id, reach) ? firstFailedUpstream(topo, nodes, down, silent, id, windowMs) : null;
    if (cause) stranded.push({ nodeId: id, ...cause });
    else roots.push(id);
  }
  return { roots, stranded, deferred };
}

const isReporting = (n?: WatchedNode) => n != null && (n.state === 'online' || n.state === 'degraded');
const isQuiet = (n: WatchedNode, nowMs: number) => n.lastSeenAtMs == null || nowMs - n.lastSeenAtMs >= n.offlineWindowS * 1000;

function hasLiveNeighbourIn(graph: Graph, id: number, reach: Set<number>) {
  return (graph.adjacency.get(id) ?? []).some((e) => e.live && reach.has(e.to));
}

/** The most upstream failed node on the node's path, if its failure explains this node's silence. */
function firstFailedUpstream(topo: Topology, nodes: Map<number, WatchedNode>, down: Set<number>, silent: Set<number>, id: number, windowMs: number) {
  const path = pathNodes(topo.paths, id);
  const rootId = [...path.slice(1)].reverse().find((u) => down.has(u));
  const root = rootId == null ? undefined : nodes.get(rootId);
  const n = nodes.get(id)!;
  if (!root) return null;
  if (root.state === 'maintenance' && !silent.has(root.id)) return { rootNodeId: root.id, cause: 'maintenance' as const };
  const together = n.lastSeenAtMs != null && root.lastSeenAtMs != null && Math.abs(n.lastSeenAtMs - root.lastSeenAtMs) <= windowMs;
  if (!together) return null;
  if (root.isUplink) return { rootNodeId: root.id, cause: 'partition' as const };
  if (silent.has(root.id) || root.state === 'offline') return { rootNodeId: root.id, cause: 'outage' as const };
  return null; // stranded or quiet for other reasons itself: this node is judged on its own
}
