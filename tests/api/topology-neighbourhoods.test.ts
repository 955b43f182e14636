// GET /api/v1/topology/neighbourhoods: the map's quick per-neighbourhood state counts, scoped like the graph.
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import type { NodeState } from '../../shared/enums';
import { topologyNeighbourhoodsResponseSchema, type TopologyNeighbourhoodDto } from '../../shared/schemas/topology';
import type { Neighbourhood, User } from '../../server/models';
import { type Agent, buildUser, call, signIn, useApi } from '../helpers/api';
import { buildNeighbourhood, buildNode, buildSite } from '../helpers/factories';

type Who = 'admin' | 'operatorA' | 'operatorB' | 'hostA';

describe('GET /api/v1/topology/neighbourhoods', () => {
  const ctx = useApi();
  const people = {} as Record<Who, User>;
  const agents = {} as Record<Who, Agent>;
  let hoodA: Neighbourhood;
  let hoodB: Neighbourhood;

  beforeAll(async () => {
    people.admin = await buildUser({ role: 'admin' });
    people.operatorA = await buildUser({ role: 'operator' });
    people.operatorB = await buildUser({ role: 'operator' });
    people.hostA = await buildUser({ role: 'host' });
    hoodA = await buildNeighbourhood({ operators: [people.operatorA] });
    hoodB = await buildNeighbourhood({ operators: [people.operatorB] });
    // Two nodes on the hosted roof, one on a second roof of the same neighbourhood, one elsewhere.
    const hosted = await buildSite({ neighbourhoodId: hoodA.id, hostUserId: people.hostA.id, latitude: 47.6, longitude: -38.4 });
    const other = await buildSite({ neighbourhoodId: hoodA.id, latitude: 47.63, longitude: -38.43 });
    const far = await buildSite({ neighbourhoodId: hoodB.id, latitude: 47.7, longitude: -38.5 });
    const place: [number, NodeState][] = [
      [hosted.id, 'online'],
      [hosted.id, 'offline'],
      [other.id, 'degraded'],
      [far.id, 'maintenance'],
    ];
    for (const [siteId, state] of place) await (await buildNode({ siteId })).update({ state });
    for (const who of Object.keys(people) as Who[]) agents[who] = await signIn(ctx, people[who]);
  });

  const summary = async (who: Who) => {
    const res = await call(agents[who], 'get', '/api/v1/topology/neighbourhoods');
    expect(res.status).toBe(200);
    const body = topologyNeighbourhoodsResponseSchema.parse(res.body);
    return new Map(body.data.map((h) => [h.neighbourhoodId, h]));
  };
  const counts = (h: TopologyNeighbourhoodDto | undefined) => h && Object.entries(h.counts).filter(([, c]) => c > 0);

  it("an admin gets every neighbourhood with every state counted and the mean of its nodes' roofs", async () => {
    const hoods = await summary('admin');
    const a = hoods.get(hoodA.id)!;
    expect(a.name).toBe(hoodA.name);
    expect(a.total).toBe(3);
    expect(counts(a)).toEqual([
      ['online', 1],
      ['degraded', 1],
      ['offline', 1],
    ]);
    expect(a.counts.stranded).toBe(0); // absent states are 0, not missing
    // Hand-computed means over the three nodes: (2 × 47.6 + 47.63) / 3 and (2 × -38.4 + -38.43) / 3.
    expect(a.latitude).toBeCloseTo(47.61, 9);
    expect(a.longitude).toBeCloseTo(-38.41, 9);
    expect(hoods.get(hoodB.id)).toMatchObject({ total: 1, latitude: 47.7, longitude: -38.5 });
    expect(counts(hoods.get(hoodB.id))).toEqual([['maintenance', 1]]);
  });

  it('an operator gets only the neighbourhoods they are assigned to', async () => {
    const a = await summary('operatorA');
    expect([...a.keys()]).toEqual([hoodA.id]);
    expect(a.get(hoodA.id)!.total).toBe(3);
    const b = await summary('operatorB');
    expect([...b.keys()]).toEqual([hoodB.id]);
  });

  it('a host gets only the nodes on the roofs they host', async () => {
    const h = await summary('hostA');
    expect([...h.keys()]).toEqual([hoodA.id]);
    expect(counts(h.get(hoodA.id))).toEqual([
      ['online', 1],
      ['offline', 1],
    ]);
    expect(h.get(hoodA.id)).toMatchObject({ total: 2, latitude: 47.6, longitude: -38.4 });
  });

  it('agrees with the full graph for every role', async () => {
    for (const who of Object.keys(people) as Who[]) {
      const graph = await call(agents[who], 'get', '/api/v1/topology');
      const fromGraph = new Map<number, number>();
      for (const n of graph.body.data.nodes as { neighbourhoodId: number }[]) fromGraph.set(n.neighbourhoodId, (fromGraph.get(n.neighbourhoodId) ?? 0) + 1);
      const hoods = await summary(who);
      expect(new Map([...hoods.values()].map((h) => [h.neighbourhoodId, h.total])), who).toEqual(fromGraph);
    }
  });

  it('refuses a caller who is not signed in', async () => {
    expect((await request(ctx.app).get('/api/v1/topology/neighbourhoods')).status).toBe(401);
  });
});
