import { describe, expect, it } from 'vitest';
import { DEFAULT_THRESHOLDS, afterReport, isSilent, snrDb, weaknesses, type HealthMemory } from '../../../shared/health/state';

const t = { ...DEFAULT_THRESHOLDS, minSignalDbm: -80, minSnrDb: 15, minThroughputMbps: 2, hysteresisDb: 3, consecutiveReports: 2 };
const good = { signalDbm: -60, snrDb: 35, throughputMbps: 40 };
const weak = { signalDbm: -84, snrDb: 11, throughputMbps: 40 };
const marginal = { signalDbm: -79, snrDb: 16, throughputMbps: 40 }; // above the limit, inside the dead band

function run(start: HealthMemory, figures: object[]) {
  let mem = start;
  return figures.map((f) => {
    const v = afterReport(mem, f, t);
    mem = { state: v.state, streak: v.streak };
    return v.state;
  });
}

describe('health state after a report', () => {
  it('moves a node from unknown straight to online on a good first report', () => {
    expect(afterReport({ state: 'unknown', streak: 0 }, good, t).state).toBe('online');
  });

  it('moves a node from unknown straight to degraded on a weak first report', () => {
    const v = afterReport({ state: 'unknown', streak: 0 }, weak, t);
    expect(v.state).toBe('degraded');
    expect(v.reason).toContain('signal -84 dBm below -80 dBm');
  });

  it('brings an offline node back as online on its first fresh report', () => {
    expect(afterReport({ state: 'offline', streak: 0 }, good, t).state).toBe('online');
  });

  it('needs consecutive weak reports before degrading (one dip does not flap)', () => {
    expect(run({ state: 'online', streak: 0 }, [weak, good, weak, good])).toEqual(['online', 'online', 'online', 'online']);
    expect(run({ state: 'online', streak: 0 }, [weak, weak])).toEqual(['online', 'degraded']);
  });

  it('keeps a degraded node degraded while it hovers just above the threshold (hysteresis)', () => {
    expect(run({ state: 'degraded', streak: 0 }, [marginal, marginal, marginal, marginal])).toEqual(['degraded', 'degraded', 'degraded', 'degraded']);
  });

  it('recovers a degraded node only after consecutive reports clear of the dead band', () => {
    expect(run({ state: 'degraded', streak: 0 }, [good, marginal, good, good])).toEqual(['degraded', 'degraded', 'degraded', 'online']);
  });

  it('does not flap when figures alternate around the threshold', () => {
    const alternating = Array.from({ length: 12 }, (_, i) => (i % 2 ? { signalDbm: -81 } : { signalDbm: -79 }));
    const states = run({ state: 'online', streak: 0 }, alternating);
    expect(new Set(states)).toEqual(new Set(['online']));
  });

  it('leaves a node in maintenance alone', () => {
    expect(afterReport({ state: 'maintenance', streak: 0 }, weak, t).state).toBe('maintenance');
  });

  it('judges throughput too', () => {
    expect(weaknesses({ throughputMbps: 1 }, t)).toEqual(['throughput 1 Mbps below 2 Mbps']);
    expect(weaknesses({}, t)).toEqual([]);
  });
});

describe('silence', () => {
  const base = new Date('2026-06-01T12:00:00Z');
  const at = (s: number) => new Date(base.getTime() + s * 1000);

  it('counts a node silent after three missed intervals (default)', () => {
    expect(DEFAULT_THRESHOLDS.offlineAfterIntervals).toBe(3);
    expect(isSilent(at(179), at(0), at(-3600), 60, t)).toBe(false);
    expect(isSilent(at(180), at(0), at(-3600), 60, t)).toBe(true);
  });

  it('measures silence from when Parapet resumed watching, not from before its own downtime', () => {
    // Last report an hour ago, but Parapet only came back 10 s ago: not yet silent.
    expect(isSilent(at(3600), at(0), at(3590), 60, t)).toBe(false);
    expect(isSilent(at(3590 + 180), at(0), at(3590), 60, t)).toBe(true);
  });
});

describe('SNR', () => {
  // REFERENCES.md, Noise and SNR: SNR = Prx − N
  it('is signal minus noise in dB', () => {
    expect(snrDb(-65, -95)).toBe(30);
    expect(snrDb(-65, undefined)).toBeNull();
  });
});
