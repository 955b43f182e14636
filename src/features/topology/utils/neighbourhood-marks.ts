// The map's neighbourhood view: one mark per neighbourhood, with how many of its nodes are in each state.
import { NODE_STATES, type NodeState } from '../../../../shared/enums';
import type { TopologyNode } from '../api/topology';
import type { XY } from './layout';

export interface NeighbourhoodSummary {
  neighbourhoodId: number;
  name: string;
  total: number;
  counts: Record<NodeState, number>;
  /** The mean of its nodes' graph positions: where its mark sits. */
  centre: XY;
}

const noCounts = (): Record<NodeState, number> => Object.fromEntries(NODE_STATES.map((s) => [s, 0])) as Record<NodeState, number>;

/** One summary per neighbourhood that has nodes among `nodes`, in name order. */
export function summariseNeighbourhoods(nodes: TopologyNode[], positions: Map<number, XY>, names: Map<number, string>): NeighbourhoodSummary[] {
  const byHood = new Map<number, NeighbourhoodSummary & { sumX: number; sumY: number; placed: number }>();
  for (const node of nodes) {
    let hood = byHood.get(node.neighbourhoodId);
    if (!hood) {
      const name = names.get(node.neighbourhoodId) ?? `Neighbourhood ${node.neighbourhoodId}`;
      hood = { neighbourhoodId: node.neighbourhoodId, name, total: 0, counts: noCounts(), centre: { x: 0, y: 0 }, sumX: 0, sumY: 0, placed: 0 };
      byHood.set(node.neighbourhoodId, hood);
    }
    hood.total++;
    hood.counts[node.state]++;
    const at = positions.get(node.id);
    if (at) {
      hood.sumX += at.x;
      hood.sumY += at.y;
      hood.placed++;
    }
  }
  return [...byHood.values()]
    .map(({ sumX, sumY, placed, ...hood }) => ({ ...hood, centre: placed ? { x: sumX / placed, y: sumY / placed } : hood.centre }))
    .sort((a, b) => a.name.localeCompare(b.name) || a.neighbourhoodId - b.neighbourhoodId);
}

/** "12 online, 3 offline": the states present, in the fixed order of the states, as words. */
export function countsInWords(counts: Record<NodeState, number>, word: (state: NodeState) => string): string {
  const parts = NODE_STATES.filter((s) => counts[s] > 0).map((s) => `${counts[s]} ${word(s).toLowerCase()}`);
  return parts.length ? parts.join(', ') : 'no nodes';
}

/** A stable text form of the counts for tests and screen readers' change checks: "online:12,offline:3". */
export function countsKey(counts: Record<NodeState, number>): string {
  return NODE_STATES.filter((s) => counts[s] > 0)
    .map((s) => `${s}:${counts[s]}`)
    .join(',');
}
