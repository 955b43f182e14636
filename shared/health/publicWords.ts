import type { NodeState } from '../enums';

// Plain words for neighbours: how many nodes are up, and what is down since when. No names.

export const UP_STATES: readonly NodeState[] = ['online', 'degraded', 'maintenance'];
export const DOWN_STATES: readonly NodeState[] = ['offline', 'stranded'];

export interface NodeCounts {
  total: number;
  up: number;
  down: number;
  unknown: number;
}

export function countStates(states: NodeState[]): NodeCounts {
  return {
    total: states.length,
    up: states.filter((s) => UP_STATES.includes(s)).length,
    down: states.filter((s) => DOWN_STATES.includes(s)).length,
    unknown: states.filter((s) => s === 'unknown').length,
  };
}

const nodes = (n: number) => (n === 1 ? 'node' : 'nodes');

/** "9 of 9 nodes up", "2 of 8 down since 14:20", with a note for nodes never heard from. */
export function statusSentence(c: NodeCounts, downSinceClock: string | null): string {
  if (c.total === 0) return 'No nodes here yet.';
  const unknownNote = c.unknown > 0 ? `; ${c.unknown} not heard from yet` : '';
  if (c.down > 0) return `${c.down} of ${c.total} down${downSinceClock ? ` since ${downSinceClock}` : ''}${unknownNote}.`;
  return `${c.up} of ${c.total} ${nodes(c.total)} up${unknownNote}.`;
}

/** One open outage in plain words: which kind of node, where, since when; never its name or place. */
export function outageSentence(o: { neighbourhood: string; state: 'offline' | 'stranded'; isUplink: boolean; sinceClock: string }): string {
  const what = o.isUplink ? 'The node that carries the internet uplink' : 'A rooftop node';
  if (o.state === 'stranded') return `${what} in ${o.neighbourhood} has been cut off since ${o.sinceClock}, because a link further up the network is down.`;
  return `${what} in ${o.neighbourhood} has been down since ${o.sinceClock}.`;
}
