import { describe, expect, it } from 'vitest';
import type { TopologyNode } from '../../../src/features/topology/api/topology';
import { countsInWords, countsKey, summariseNeighbourhoods } from '../../../src/features/topology/utils/neighbourhood-marks';
import { stateWord } from '../../../src/components/state-badge';

const node = (id: number, neighbourhoodId: number, state: TopologyNode['state']): TopologyNode => ({
  id,
  name: `n${id}`,
  siteId: id,
  siteName: `s${id}`,
  neighbourhoodId,
  latitude: 0,
  longitude: 0,
  state,
  isUplink: false,
  lastSeenAt: null,
  openOutageId: null,
  strandedBy: null,
  blastNodeCount: 0,
});

describe('neighbourhood marks', () => {
  const nodes = [node(1, 7, 'online'), node(2, 7, 'offline'), node(3, 7, 'online'), node(4, 9, 'degraded')];
  const positions = new Map([
    [1, { x: 0, y: 0 }],
    [2, { x: 30, y: 0 }],
    [3, { x: 0, y: 60 }],
    [4, { x: -5, y: -5 }],
  ]);

  it('counts each neighbourhood’s nodes by state and places its mark at their mean position', () => {
    const [b, a] = summariseNeighbourhoods(
      nodes,
      positions,
      new Map([
        [7, 'Ropewalk End'],
        [9, 'Brinefold'],
      ]),
    );
    expect(a).toMatchObject({ neighbourhoodId: 7, name: 'Ropewalk End', total: 3, centre: { x: 10, y: 20 } });
    expect(a.counts).toMatchObject({ online: 2, offline: 1, degraded: 0 });
    expect(b).toMatchObject({ neighbourhoodId: 9, name: 'Brinefold', total: 1, centre: { x: -5, y: -5 } });
    expect(countsKey(a.counts)).toBe('online:2,offline:1');
    expect(countsInWords(a.counts, stateWord)).toBe('2 online, 1 offline');
  });

  it('names a neighbourhood it has no name for by its id, and leaves out neighbourhoods with no nodes', () => {
    const summaries = summariseNeighbourhoods(nodes.slice(3), positions, new Map());
    expect(summaries).toHaveLength(1);
    expect(summaries[0].name).toBe('Neighbourhood 9');
  });
});
