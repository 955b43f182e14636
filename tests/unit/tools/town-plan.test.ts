import { describe, expect, it } from 'vitest';
import { HOOD_SIZE, planTown, subtrees } from '../../../server/tools/simulateTown';

describe('the synthetic town for load runs', () => {
  const plan = planTown(10_000);

  it('has 10,000 uniquely named nodes in neighbourhoods of 250, each with one uplinked hub', () => {
    expect(plan.nodes).toHaveLength(10_000);
    expect(plan.hoods).toHaveLength(40);
    expect(new Set(plan.hoods).size).toBe(40);
    expect(new Set(plan.nodes.map((n) => n.name.toLowerCase())).size).toBe(10_000);
    const hubs = plan.nodes.filter((n) => n.role === 'hub');
    expect(hubs.map((h) => h.hood)).toEqual(plan.hoods.map((_, i) => i));
    expect(hubs.every((h) => h.parent === null)).toBe(true);
    for (let h = 0; h < 40; h++) expect(plan.nodes.filter((n) => n.hood === h)).toHaveLength(HOOD_SIZE);
  });

  it('is a backhaul forest: every other node hangs from an earlier hub or relay of its own neighbourhood', () => {
    plan.nodes.forEach((n, i) => {
      if (n.role === 'hub') return;
      expect(n.parent).not.toBeNull();
      expect(n.parent!).toBeLessThan(i);
      const parent = plan.nodes[n.parent!];
      expect(parent.role).not.toBe('leaf');
      expect(parent.hood).toBe(n.hood);
    });
    // Relays in two tiers: some relays hang behind other relays, so a cut there strands a deeper tree.
    expect(plan.nodes.some((n) => n.role === 'relay' && plan.nodes[n.parent!].role === 'relay')).toBe(true);
  });

  it('knows which nodes a power cut strands: a hub strands its whole neighbourhood, a leaf nobody', () => {
    const below = subtrees(plan);
    const hub = plan.nodes.findIndex((n) => n.role === 'hub' && n.hood === 3);
    expect(below[hub]).toHaveLength(HOOD_SIZE - 1);
    expect(below[hub].every((i) => plan.nodes[i].hood === 3)).toBe(true);
    const tier2 = plan.nodes.findIndex((n) => n.role === 'relay' && plan.nodes[n.parent!].role === 'relay');
    const tier1 = plan.nodes[tier2].parent!;
    expect(below[tier1]).toContain(tier2);
    expect(below[tier1].length).toBeGreaterThan(below[tier2].length);
    for (const i of below[tier2]) expect(plan.nodes[i].parent).toBe(tier2); // its houses
    expect(below[plan.nodes.findIndex((n) => n.role === 'leaf')]).toEqual([]);
  });

  it('comes out the same for the same seed, and refuses a count that is not a whole number of nodes', () => {
    expect(planTown(300, 5)).toEqual(planTown(300, 5));
    expect(planTown(300, 5)).not.toEqual(planTown(300, 6));
    expect(planTown(1).nodes).toEqual([expect.objectContaining({ role: 'hub', parent: null })]);
    expect(planTown(251).nodes.at(-1)).toMatchObject({ role: 'hub', hood: 1 });
    expect(() => planTown(0)).toThrow(/whole number of nodes/);
    expect(() => planTown(2.5)).toThrow(/whole number of nodes/);
  });
});
