// Paths from every node to an uplink, and what a failure cuts off. Pure; no I/O.
import { PriorityQueue } from '@datastructures-js/priority-queue';

export interface GraphNode {
  id: number;
  isUplink: boolean;
}
export interface GraphLink {
  id: number;
  nodeAId: number;
  nodeBId: number;
  live: boolean;
  fadeMarginDb: number | null;
}

export interface NodePath {
  nodeId: number;
  uplinkId: number;
  /** The next node toward the uplink (null on an uplink) and the link to it. */
  nextNodeId: number | null;
  nextLinkId: number | null;
  hops: number;
  plannedLinks: number;
  /** The smallest fade margin along the path (dB); -Infinity when some link's margin is unknown, +Infinity on an uplink. */
  weakestMarginDb: number;
}

interface Edge {
  to: number;
  linkId: number;
  live: boolean;
  marginDb: number;
}
export interface Graph {
  nodes: Map<number, GraphNode>;
  adjacency: Map<number, Edge[]>;
  uplinkIds: number[];
}

/** Margins are compared at 0.1 dB, so float noise between two equal predictions is a tie. */
const marginKey = (m: number | null) => (m == null || !Number.isFinite(m) ? -Infinity : Math.round(m * 10) / 10);

/** Adjacency lists; links to nodes not in the list (deleted, out of inventory) and self-links are left out. */
export function buildGraph(nodes: GraphNode[], links: GraphLink[]): Graph {
  const byId = new Map(nodes.map((n) => [n.id, n]));
  const adjacency = new Map<number, Edge[]>(nodes.map((n) => [n.id, []]));
  for (const l of [...links].sort((a, b) => a.id - b.id)) {
    if (l.nodeAId === l.nodeBId || !byId.has(l.nodeAId) || !byId.has(l.nodeBId)) continue;
    const marginDb = marginKey(l.fadeMarginDb);
    adjacency.get(l.nodeAId)!.push({ to: l.nodeBId, linkId: l.id, live: l.live, marginDb });
    adjacency.get(l.nodeBId)!.push({ to: l.nodeAId, linkId: l.id, live: l.live, marginDb });
  }
  const uplinkIds = nodes
    .filter((n) => n.isUplink)
    .map((n) => n.id)
    .sort((a, b) => a - b);
  return { nodes: byId, adjacency, uplinkIds };
}

interface Label {
  node: number;
  planned: number;
  weakest: number;
  hops: number;
  uplink: number;
  via: number;
  viaLink: number;
}

/** Lexicographic order: fewer planned links, then the larger weakest margin, fewer hops, lower uplink id, lower next-node id. */
function compareLabels(a: Label, b: Label) {
  return (
    a.planned - b.planned ||
    (b.weakest === a.weakest ? 0 : b.weakest > a.weakest ? 1 : -1) ||
    a.hops - b.hops ||
    a.uplink - b.uplink ||
    a.via - b.via ||
    a.node - b.node
  );
}

/**
 * Every node's path to an uplink (bottleneck "widest path" search, a label-setting pass from all
 * uplinks at once; common practice, no source). The rule: prefer the path with the fewest planned
 * links (live ones carry traffic), then the one whose weakest link has the most fade margin, then
 * fewer hops, then the lower uplink id and the lower next-node id. Paths form a tree: each node's
 * path is its next node's path plus one link. Nodes with no path at all are absent from the result.
 * One pass: O((N + E) log N).
 */
export function pathsToUplink(graph: Graph): Map<number, NodePath> {
  const settled = new Map<number, NodePath>();
  const best = new Map<number, Label>();
  const queue = new PriorityQueue<Label>(compareLabels);
  for (const id of graph.uplinkIds) {
    const l: Label = { node: id, planned: 0, weakest: Infinity, hops: 0, uplink: id, via: -1, viaLink: -1 };
    best.set(id, l);
    queue.enqueue(l);
  }
  while (!queue.isEmpty()) {
    const cur = queue.dequeue()!;
    if (settled.has(cur.node) || best.get(cur.node) !== cur) continue;
    settled.set(cur.node, {
      nodeId: cur.node,
      uplinkId: cur.uplink,
      nextNodeId: cur.via < 0 ? null : cur.via,
      nextLinkId: cur.viaLink < 0 ? null : cur.viaLink,
      hops: cur.hops,
      plannedLinks: cur.planned,
      weakestMarginDb: cur.weakest,
    });
    for (const e of graph.adjacency.get(cur.node) ?? []) {
      if (settled.has(e.to)) continue;
      const next: Label = {
        node: e.to,
        planned: cur.planned + (e.live ? 0 : 1),
        weakest: Math.min(cur.weakest, e.marginDb),
        hops: cur.hops + 1,
        uplink: cur.uplink,
        via: cur.node,
        viaLink: e.linkId,
      };
      const old = best.get(e.to);
      if (!old || compareLabels(next, old) < 0) {
        best.set(e.to, next);
        queue.enqueue(next);
      }
    }
  }
  return settled;
}

/** The nodes on a node's path, from the node itself up to and including its uplink; [] when it has none. */
export function pathNodes(paths: Map<number, NodePath>, nodeId: number): number[] {
  const out: number[] = [];
  for (let p = paths.get(nodeId); p; p = p.nextNodeId == null ? undefined : paths.get(p.nextNodeId)) {
    out.push(p.nodeId);
    if (out.length > paths.size) break; // a tree cannot loop; this guards a corrupted map
  }
  return out;
}

export interface Failure {
  nodeIds?: Iterable<number>;
  linkIds?: Iterable<number>;
  liveOnly?: boolean;
}

/**
 * The nodes still joined to a working uplink when the given nodes and links have failed: one
 * breadth-first pass from every uplink that is up (O(N + E)). With `liveOnly`, planned links carry nothing.
 */
export function reachable(graph: Graph, failure: Failure = {}): Set<number> {
  const downNodes = new Set(failure.nodeIds ?? []);
  const downLinks = new Set(failure.linkIds ?? []);
  const seen = new Set<number>();
  const stack = graph.uplinkIds.filter((id) => !downNodes.has(id));
  stack.forEach((id) => seen.add(id));
  while (stack.length) {
    const id = stack.pop()!;
    for (const e of graph.adjacency.get(id) ?? []) {
      if (seen.has(e.to) || downNodes.has(e.to) || downLinks.has(e.linkId) || (failure.liveOnly && !e.live)) continue;
      seen.add(e.to);
      stack.push(e.to);
    }
  }
  return seen;
}

/**
 * The nodes that lose every path to an uplink when `failure` happens, beyond the failed nodes
 * themselves; a node with a second path is not among them. Sorted by id.
 */
export function dependants(graph: Graph, failure: Failure): number[] {
  const before = reachable(graph, { liveOnly: failure.liveOnly });
  const after = reachable(graph, failure);
  const failed = new Set(failure.nodeIds ?? []);
  return [...before].filter((id) => !after.has(id) && !failed.has(id)).sort((a, b) => a - b);
}
