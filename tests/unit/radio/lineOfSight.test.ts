import { describe, expect, it } from 'vitest';
import { ackDistanceSettingKm, fresnelKirchhoffNu, knifeEdgeLossDb, lineOfSight, radioHorizonKm, roundTripUs } from '../../../shared/radio/lineOfSight';

describe('ITU-R P.526 single knife edge', () => {
  it('J(ν) matches the worked values J(0) ≈ 6.0 dB and J(1) ≈ 13.9 dB, and is 0 at ν ≤ −0.78', () => {
    expect(Math.abs(knifeEdgeLossDb(0) - 6.0)).toBeLessThan(0.1); // REFERENCES ITU-R P.526: J(0) ≈ 6.0 dB
    expect(Math.abs(knifeEdgeLossDb(1) - 13.9)).toBeLessThan(0.1); // REFERENCES ITU-R P.526: J(1) ≈ 13.9 dB
    expect(knifeEdgeLossDb(-0.78)).toBe(0); // ITU-R P.526: the approximation holds for ν > −0.78
    expect(knifeEdgeLossDb(-0.77)).toBeGreaterThan(0);
  });
  it('ν = h·√(2/λ·(1/d1 + 1/d2)): 10 m over the middle of 2 km at 3 GHz (λ = 0.0999 m) gives ν ≈ 2.0', () => {
    // √(2/0.09993 × (1/1000 + 1/1000)) = √0.04003 = 0.2001 per metre (ITU-R P.526 §4.1, worked by hand)
    expect(fresnelKirchhoffNu(10, 1, 1, 3000)).toBeCloseTo(2.001, 2);
  });
});

describe('radio horizon, round trip and the ACK distance', () => {
  it('4.12·(√h1 + √h2) km, ITU-R P.530 practice for k = 4/3', () => {
    expect(radioHorizonKm(30, 30)).toBeCloseTo(45.13, 2); // 4.12 × 2 × 5.477
    expect(radioHorizonKm(100, 0)).toBeCloseTo(41.2, 6); // one end on the ground
  });
  it('2d/c: 1 km is 6.67 µs, 50 km 333.6 µs (c = 299 792 458 m/s, SI definition)', () => {
    expect(roundTripUs(1)).toBeCloseTo(6.671, 3);
    expect(roundTripUs(50)).toBeCloseTo(333.564, 3);
    expect(ackDistanceSettingKm(50)).toBe(55); // path + 10 %, rounded up (common practice, no source)
  });
});

describe('line of sight over ground and obstacles', () => {
  const path = { distanceKm: 10, freqMHz: 5800, aGroundM: 0, aHeightM: 20, bGroundM: 0, bHeightM: 20, kFactor: 4 / 3 };
  it('flat 10 km at 5.8 GHz between 20 m masts is clear: the worst point is mid-path', () => {
    const los = lineOfSight(path);
    // ITU-R P.526: bulge 25/(12.742·4/3) = 1.47 m; 0.6 × F1 = 0.6 × 17.31·√(25/58) = 6.82 m; clearance 20 − 1.47 = 18.53 m
    expect(los.clear).toBe(true);
    expect(los.atDistanceKm).toBeCloseTo(5, 6);
    expect(Math.abs(los.worstClearanceM - 18.53) / 18.53).toBeLessThan(0.01);
    expect(Math.abs(los.requiredClearanceM - 6.82) / 6.82).toBeLessThan(0.01);
  });
  it('a 15 m building 2 km from a (bulge 0.94 m there) leaves 4.06 m of the 5.45 m needed: not clear', () => {
    // ITU-R P.526 at 2 km: bulge 2·8/(12.742·4/3) = 0.94 m; 0.6 × F1 = 0.6 × 17.31·√(2·8/(5.8·10)) = 5.45 m
    const los = lineOfSight({ ...path, obstacles: [{ distanceKm: 2, heightM: 15 }] });
    expect(los).toMatchObject({ clear: false, blockedBy: 'obstacle', atDistanceKm: 2 });
    expect(Math.abs(los.worstClearanceM - (20 - 15 - 0.94))).toBeLessThan(0.02);
    expect(Math.abs(los.requiredClearanceM - 5.45) / 5.45).toBeLessThan(0.01);
  });
  it('a lower k (2/3, worst case) raises the bulge and can close the path', () => {
    const tight = { ...path, aHeightM: 9, bHeightM: 9 }; // needs 6.82 + bulge; k 4/3 bulge 1.47 m → 7.53 clearance ≥ 6.82
    expect(lineOfSight(tight).clear).toBe(true);
    expect(lineOfSight(tight, 2 / 3).clear).toBe(false); // bulge 2.94 m → 6.06 m < 6.82 m
  });
});
