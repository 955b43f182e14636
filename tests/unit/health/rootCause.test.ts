import { describe, expect, it } from 'vitest';
import type { NodeState } from '../../../shared/enums';
import { buildGraph, type GraphLink, pathsToUplink, reachable } from '../../../shared/health/paths';
import { attributeSilence, type WatchedNode } from '../../../shared/health/rootCause';

// Worked by hand on small graphs (common practice, no source: the first failed node on a node's
// path explains its silence when nothing else joins it to the uplink).
const NOW = 1_000_000_000;
let linkId = 0;
const link = (a: number, b: number, live = true): GraphLink => ({ id: ++linkId, nodeAId: a, nodeBId: b, live, fadeMarginDb: 20 });

function scene(links: GraphLink[], states: Record<number, Partial<WatchedNode>> = {}) {
  const ids = [...new Set(links.flatMap((l) => [l.nodeAId, l.nodeBId]))];
  const graph = buildGraph(
    ids.map((id) => ({ id, isUplink: id === 1 })),
    links,
  );
  const topo = { graph, paths: pathsToUplink(graph), liveReach: reachable(graph, { liveOnly: true }) };
  const nodes = new Map<number, WatchedNode>(
    ids.map((id) => [
      id,
      {
        id,
        isUplink: id === 1,
        state: 'online' as NodeState,
        reportIntervalS: 60,
        offlineWindowS: 180,
        lastSeenAtMs: NOW - 181_000,
        ...states[id],
      },
    ]),
  );
  return { topo, nodes };
}

describe('root cause of a silence', () => {
  // 1 uplink — 2 backhaul — 3, 4; 4 — 5; 1 — 6 — 7
  const chain = [link(1, 2), link(2, 3), link(2, 4), link(4, 5), link(1, 6), link(6, 7)];
  const reporting = { 1: { lastSeenAtMs: NOW - 10_000 }, 6: { lastSeenAtMs: NOW - 10_000 }, 7: { lastSeenAtMs: NOW - 10_000 } };

  it('blames the most upstream silent node and strands what sits behind it', () => {
    const { topo, nodes } = scene(chain, reporting);
    const a = attributeSilence(topo, nodes, [2, 3, 4, 5], NOW, 120);
    expect(a.roots).toEqual([2]);
    expect(a.stranded).toEqual([3, 4, 5].map((nodeId) => ({ nodeId, rootNodeId: 2, cause: 'outage' })));
  });

  it('a node with a second live path is its own root; a planned second path does not count', () => {
    const { topo, nodes } = scene([...chain, link(3, 6)], reporting);
    expect(attributeSilence(topo, nodes, [2, 3], NOW, 120)).toMatchObject({ roots: [2, 3], stranded: [] });
    const planned = scene([...chain, link(3, 6, false)], reporting);
    expect(attributeSilence(planned.topo, planned.nodes, [2, 3], NOW, 120).stranded).toEqual([{ nodeId: 3, rootNodeId: 2, cause: 'outage' }]);
  });

  it('does not blame an upstream node that went quiet long before (outside the window)', () => {
    const { topo, nodes } = scene(chain, { ...reporting, 2: { state: 'offline', lastSeenAtMs: NOW - 3_600_000 } });
    expect(attributeSilence(topo, nodes, [3], NOW, 120)).toMatchObject({ roots: [3], stranded: [] });
    const recent = scene(chain, { ...reporting, 2: { state: 'offline', lastSeenAtMs: NOW - 200_000 } });
    expect(attributeSilence(recent.topo, recent.nodes, [3], NOW, 120).stranded).toEqual([{ nodeId: 3, rootNodeId: 2, cause: 'outage' }]);
  });

  it('an uplink in the silence is a partition, and so is everything cut off with it', () => {
    const { topo, nodes } = scene(chain);
    const a = attributeSilence(topo, nodes, [1, 2, 3, 4, 5, 6, 7], NOW, 120);
    expect(a.roots).toEqual([]);
    expect(a.stranded.every((s) => s.cause === 'partition' && s.rootNodeId === 1)).toBe(true);
    expect(a.stranded).toHaveLength(7);
  });

  it('a node in maintenance explains the silence behind it without an outage', () => {
    const { topo, nodes } = scene(chain, { ...reporting, 2: { state: 'maintenance', lastSeenAtMs: NOW - 400_000 } });
    expect(attributeSilence(topo, nodes, [3], NOW, 120).stranded).toEqual([{ nodeId: 3, rootNodeId: 2, cause: 'maintenance' }]);
  });

  it('waits while an upstream node has missed a report but is not judged yet, then stops waiting after the window', () => {
    const { topo, nodes } = scene(chain, { ...reporting, 2: { lastSeenAtMs: NOW - 120_000 } });
    expect(attributeSilence(topo, nodes, [3, 4, 5], NOW, 120)).toMatchObject({ deferred: [3, 4, 5], roots: [], stranded: [] });
    expect(attributeSilence(topo, nodes, [3, 4, 5], NOW + 121_000, 120).deferred).toEqual([]);
  });

  it('a node with no live path at all is judged on its own', () => {
    const { topo, nodes } = scene([link(1, 2), link(2, 3, false)], { 1: { lastSeenAtMs: NOW } });
    expect(attributeSilence(topo, nodes, [2, 3], NOW, 120)).toMatchObject({ roots: [2, 3], stranded: [] });
  });
});
