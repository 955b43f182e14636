import { describe, expect, it } from 'vitest';
import { HISTORY_DAYS, historyStart, planHistory, silences } from '../../../server/db/demoHistoryPlan';
import { DEMO_FIRMWARE, DEMO_QUIRKS, LINKS, SITES } from '../../../server/db/demoScenario';
import { monthRange } from '../../../shared/time/monthRange';

const now = new Date('2026-12-02T07:30:00Z');
const plan = planHistory(now);
const nodeNames = new Set(SITES.map((s) => s.node.name));
const intervalOf = (name: string) => SITES.find((s) => s.node.name === name)!.node.reportIntervalS;
const MIN = 60_000;

describe('the demo history plan', () => {
  it('spans about five weeks that start at a UTC midnight and end at the load', () => {
    expect(plan.start.toISOString()).toBe('2026-10-28T00:00:00.000Z');
    expect(plan.end.toISOString()).toBe('2026-12-02T07:30:00.000Z');
    expect(historyStart(now).getTime()).toBe(plan.start.getTime());
    expect((plan.end.getTime() - plan.start.getTime()) / 86_400_000).toBeGreaterThan(HISTORY_DAYS);
  });

  it('names only nodes of the scenario, and every event lies inside the history', () => {
    const all = [...plan.outages, ...plan.flaps, plan.backhaulFailure];
    for (const o of all) {
      expect(nodeNames.has(o.node), o.node).toBe(true);
      expect(o.lastReportAt > plan.start && o.backAt < plan.end, o.node).toBe(true);
    }
    expect(plan.backhaulFailure.behind.every((n) => nodeNames.has(n))).toBe(true);
    expect(nodeNames.has(plan.maintenance.node) && nodeNames.has(plan.drift.node)).toBe(true);
  });

  it('has a dozen ordinary outages, a node that changes state more often in an hour than the mail cap (4) allows, and one maintenance window', () => {
    expect(plan.outages).toHaveLength(12);
    const flapHour = plan.flaps.filter((f) => f.lastReportAt.getTime() - plan.flaps[0].lastReportAt.getTime() < 60 * MIN);
    expect(flapHour.length * 2).toBeGreaterThan(4); // an offline and a back-online change per flap
    // Each flap lasts longer than three missed reports, or the live rule would never call it offline.
    for (const f of plan.flaps) expect(f.backAt.getTime() - f.lastReportAt.getTime()).toBeGreaterThan(3 * intervalOf(f.node) * 1000);
    const m = plan.maintenance;
    expect(m.announcedAt < m.startsAt && m.startsAt < m.silentFrom && m.silentUntil < m.endsAt).toBe(true);
  });

  it('acknowledges an outage only after the live rule can have opened it (three missed reports)', () => {
    for (const o of [...plan.outages, ...plan.flaps, plan.backhaulFailure]) {
      if (!o.ack) continue;
      expect(o.ack.at.getTime() - o.lastReportAt.getTime(), o.node).toBeGreaterThan(3 * intervalOf(o.node) * 1000 + 60_000);
    }
  });

  it('strands exactly the nodes whose only backhaul runs through the failed relay', () => {
    const relayKey = SITES.find((s) => s.node.name === plan.backhaulFailure.node)!.key;
    const behind = LINKS.filter((l) => l.from[0] === relayKey && l.to[0] !== 'granary').map((l) => `lf-${l.to[0]}`);
    expect([...plan.backhaulFailure.behind].sort()).toEqual(behind.sort());
  });

  it('never has a node silent twice at once, and the failure silences its neighbourhood from the same moment', () => {
    for (const [node, spans] of silences(plan)) {
      const sorted = [...spans].sort((a, b) => a.after.getTime() - b.after.getTime());
      for (let i = 1; i < sorted.length; i++) expect(sorted[i].after.getTime(), node).toBeGreaterThanOrEqual(sorted[i - 1].until.getTime());
    }
    const s = silences(plan);
    for (const n of plan.backhaulFailure.behind)
      expect(
        s.get(n)!.some((x) => x.after.getTime() === plan.backhaulFailure.lastReportAt.getTime()),
        n,
      ).toBe(true);
  });

  it('puts several outages in last month, so its report reads like a real month', () => {
    const { start, end } = monthRange('2026-11', 'Atlantic/Azores');
    const inMonth = [...plan.outages, plan.backhaulFailure].filter((o) => o.lastReportAt >= start && o.lastReportAt < end);
    expect(inMonth.length).toBeGreaterThanOrEqual(8);
  });

  it('keeps the drifting link well below its prediction at the end (more than the 10 dB that flags it)', () => {
    expect(plan.drift.depthDb).toBe(-DEMO_QUIRKS.driftDb);
    expect(DEMO_QUIRKS.driftDb).toBeGreaterThan(10);
  });
});

describe('the demo names no real product', () => {
  it('gives every node the invented firmware (or its invented previous release) and an invented maker', () => {
    for (const s of SITES) {
      expect(s.node.firmware).toBe(DEMO_FIRMWARE);
      expect(s.node.hardware).toMatch(/^Fallwright [A-Z]\d /);
    }
    expect(Object.values(DEMO_QUIRKS.firmware).every((f) => f.startsWith('Tilecrest '))).toBe(true);
  });
});
