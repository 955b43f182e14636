import { describe, expect, it } from 'vitest';
import { buildGraph, dependants, type GraphLink, type GraphNode, pathNodes, pathsToUplink, reachable } from '../../../shared/health/paths';

// The path rule is a bottleneck ("widest") path search; its optimum is checked against brute force
// over every simple path (Pollack, "The maximum capacity through a network", Operations Research 8
// (1960), from memory; Dijkstra, Numerische Mathematik 1 (1959) for the label-setting pass).
const node = (id: number, isUplink = false): GraphNode => ({ id, isUplink });
let linkId = 0;
const link = (a: number, b: number, fadeMarginDb: number | null = 20, live = true): GraphLink => ({ id: ++linkId, nodeAId: a, nodeBId: b, live, fadeMarginDb });

describe('paths to the uplink', () => {
  it('follows a chain and reports hops, the weakest margin and the next node', () => {
    const g = buildGraph([node(1, true), node(2), node(3)], [link(1, 2, 25), link(2, 3, 12.3)]);
    const p = pathsToUplink(g);
    expect(pathNodes(p, 3)).toEqual([3, 2, 1]); // worked by hand
    expect(p.get(3)).toMatchObject({ uplinkId: 1, nextNodeId: 2, hops: 2, plannedLinks: 0, weakestMarginDb: 12.3 });
    expect(p.get(1)).toMatchObject({ nextNodeId: null, hops: 0, weakestMarginDb: Infinity });
  });

  it('prefers live links over planned ones, then the larger weakest margin over fewer hops', () => {
    // 1 = uplink. Node 4: via 2 on a planned link with 30 dB, or via 3 (two live hops) with 8 dB weakest.
    const g = buildGraph(
      [node(1, true), node(2), node(3), node(4), node(5)],
      [
        link(1, 2, 30),
        link(2, 4, 30, false),
        link(1, 3, 8),
        link(3, 4, 15),
        // Node 5: one hop at 6 dB, or two hops whose weakest is 10 dB.
        link(1, 5, 6),
        link(2, 5, 10),
      ],
    );
    const p = pathsToUplink(g);
    expect(pathNodes(p, 4)).toEqual([4, 3, 1]); // live beats planned, worked by hand
    expect(p.get(4)!.weakestMarginDb).toBe(8);
    expect(pathNodes(p, 5)).toEqual([5, 2, 1]); // 10 dB weakest beats 6 dB
  });

  it('uses a planned link when nothing live reaches the node, and counts it', () => {
    const g = buildGraph([node(1, true), node(2)], [link(1, 2, 20, false)]);
    expect(pathsToUplink(g).get(2)).toMatchObject({ plannedLinks: 1, nextNodeId: 1 });
  });

  it('breaks ties deterministically: fewer hops, then the lower uplink id, then the lower next node', () => {
    const g = buildGraph(
      [node(9, true), node(4, true), node(5), node(6), node(7), node(8)],
      [
        link(9, 5, 20),
        link(4, 5, 20), // equal margin and hops to two uplinks → uplink 4
        link(5, 7, 20),
        link(6, 7, 20),
        link(4, 6, 20), // 7 via 5 or via 6, both two hops from uplink 4 → next node 5
        link(5, 8, 20),
        link(6, 8, 20),
        link(7, 8, 20), // 8: two hops via 5 or 6 beats three via 7 → 5
      ],
    );
    const p = pathsToUplink(g);
    expect(p.get(5)!.uplinkId).toBe(4);
    expect(p.get(7)!.nextNodeId).toBe(5);
    expect(p.get(8)!.nextNodeId).toBe(5);
    // The same answer whatever order the links arrive in.
    const shuffled = buildGraph(
      [node(8), node(7), node(6), node(5), node(4, true), node(9, true)],
      [
        { id: 8, nodeAId: 8, nodeBId: 7, live: true, fadeMarginDb: 20 },
        { id: 1, nodeAId: 5, nodeBId: 9, live: true, fadeMarginDb: 20 },
        { id: 7, nodeAId: 8, nodeBId: 6, live: true, fadeMarginDb: 20 },
        { id: 2, nodeAId: 5, nodeBId: 4, live: true, fadeMarginDb: 20 },
        { id: 6, nodeAId: 8, nodeBId: 5, live: true, fadeMarginDb: 20 },
        { id: 3, nodeAId: 7, nodeBId: 5, live: true, fadeMarginDb: 20 },
        { id: 5, nodeAId: 6, nodeBId: 4, live: true, fadeMarginDb: 20 },
        { id: 4, nodeAId: 7, nodeBId: 6, live: true, fadeMarginDb: 20 },
      ],
    );
    const q = pathsToUplink(shuffled);
    for (const id of [5, 6, 7, 8]) expect(pathNodes(q, id)).toEqual(pathNodes(p, id));
  });

  it('handles cycles, treats margins within 0.1 dB as equal, and an unknown margin as the worst', () => {
    const g = buildGraph(
      [node(1, true), node(2), node(3), node(4)],
      [
        link(1, 2, 20.02),
        link(2, 3, 20),
        link(3, 4, 20),
        link(4, 1, 19.98), // a ring
      ],
    );
    const p = pathsToUplink(g);
    expect(p.size).toBe(4);
    expect(pathNodes(p, 3)).toEqual([3, 2, 1]); // both ways weakest 20.0 dB and two hops: lower next node (2)
    const unknown = buildGraph([node(1, true), node(2), node(3)], [link(1, 2, null), link(1, 3, 1), link(3, 2, 1)]);
    expect(pathNodes(pathsToUplink(unknown), 2)).toEqual([2, 3, 1]);
  });

  it('gives no path to unreachable nodes, and ignores links to missing nodes and self-links', () => {
    const g = buildGraph([node(1, true), node(2), node(3)], [link(1, 2), link(3, 99), link(3, 3)]);
    const p = pathsToUplink(g);
    expect(p.has(3)).toBe(false);
    expect(pathNodes(p, 3)).toEqual([]);
    expect(pathsToUplink(buildGraph([node(1), node(2)], [link(1, 2)])).size).toBe(0); // no uplink marked
  });

  it('matches brute force over every simple path on random small graphs', () => {
    let seed = 7;
    const rand = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
    for (let trial = 0; trial < 200; trial++) {
      const n = 7;
      const nodes = Array.from({ length: n }, (_, i) => node(i + 1, i === 0 || (i === 5 && trial % 3 === 0)));
      const links: GraphLink[] = [];
      for (let a = 1; a <= n; a++) for (let b = a + 1; b <= n; b++) if (rand() < 0.35) links.push(link(a, b, Math.round(rand() * 30), rand() < 0.8));
      const g = buildGraph(nodes, links);
      const p = pathsToUplink(g);
      for (const target of nodes) {
        const brute = bestByBruteForce(nodes, links, target.id);
        expect(p.has(target.id)).toBe(brute !== null);
        if (brute) expect([p.get(target.id)!.plannedLinks, p.get(target.id)!.weakestMarginDb]).toEqual(brute);
      }
    }
  });
});

/** The best (planned links, weakest margin) over every simple path from `from` to any uplink. */
function bestByBruteForce(nodes: GraphNode[], links: GraphLink[], from: number): [number, number] | null {
  const uplinks = new Set(nodes.filter((x) => x.isUplink).map((x) => x.id));
  let best: [number, number] | null = null;
  const walk = (at: number, seen: Set<number>, planned: number, weakest: number) => {
    if (uplinks.has(at)) {
      if (!best || planned < best[0] || (planned === best[0] && weakest > best[1])) best = [planned, weakest];
    }
    for (const l of links) {
      const to = l.nodeAId === at ? l.nodeBId : l.nodeBId === at ? l.nodeAId : null;
      if (to == null || seen.has(to)) continue;
      walk(to, new Set([...seen, to]), planned + (l.live ? 0 : 1), Math.min(weakest, l.fadeMarginDb ?? -Infinity));
    }
  };
  walk(from, new Set([from]), 0, Infinity);
  return best;
}

describe('what a failure cuts off', () => {
  // uplink 1 — 2 (backhaul) — 3, 4, 5 (a neighbourhood); 2 — 6 — 7 and a second way 1 — 8 — 7.
  const g = buildGraph(
    [1, 2, 3, 4, 5, 6, 7, 8].map((id) => node(id, id === 1)),
    [link(1, 2), link(2, 3), link(2, 4), link(4, 5), link(2, 6), link(6, 7), link(1, 8), link(8, 7)],
  );

  it('a node behind a single backhaul depends on it; one with a second path does not', () => {
    expect(dependants(g, { nodeIds: [2] })).toEqual([3, 4, 5]); // 6 and 7 keep their path through 8
    expect(dependants(g, { nodeIds: [4] })).toEqual([5]);
    expect(dependants(g, { nodeIds: [7] })).toEqual([]);
    expect(dependants(g, { nodeIds: [1] })).toEqual([2, 3, 4, 5, 6, 7, 8]); // the uplink itself
  });

  it('a failed link cuts off what sits behind it, and two failures together can cut what neither does alone', () => {
    const l24 = [...g.adjacency.get(2)!].find((e) => e.to === 4)!.linkId;
    expect(dependants(g, { linkIds: [l24] })).toEqual([4, 5]);
    expect(dependants(g, { nodeIds: [6] })).toEqual([]);
    expect(dependants(g, { nodeIds: [6, 8] })).toEqual([7]);
  });

  it('planned links carry nothing when only live ones count', () => {
    const h = buildGraph([node(1, true), node(2), node(3)], [link(1, 2), link(2, 3), link(1, 3, 20, false)]);
    expect(dependants(h, { nodeIds: [2] })).toEqual([]);
    expect(dependants(h, { nodeIds: [2], liveOnly: true })).toEqual([3]);
    expect(reachable(h, { liveOnly: true, nodeIds: [2] })).toEqual(new Set([1]));
  });
});
