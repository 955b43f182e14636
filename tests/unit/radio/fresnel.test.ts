import { describe, expect, it } from 'vitest';
import {
  EARTH_RADIUS_KM,
  EFFECTIVE_EARTH_K,
  clearanceNeededM,
  earthBulgeM,
  fresnelRadiusM,
  midPathEarthBulgeM,
  midPathFresnelRadiusM,
} from '../../../shared/radio/fresnel';

const within1Pct = (actual: number, expected: number) => expect(Math.abs(actual - expected) / expected).toBeLessThan(0.01);
// ITU-R P.526 Annex 1 §2.1, practical form: R1[m] = 17.31·sqrt(d1·d2/(f GHz·D)), distances in km.
const practicalR1 = (fGHz: number, d1: number, d2: number) => 17.31 * Math.sqrt((d1 * d2) / (fGHz * (d1 + d2)));

describe('first Fresnel zone', () => {
  it.each([
    [2437, 0.5, 0.5],
    [2437, 1, 4],
    [5800, 5, 5],
    [5500, 2, 18],
  ])('matches the practical form at %d MHz, d1 %d km, d2 %d km within 1 %', (f, d1, d2) => {
    within1Pct(fresnelRadiusM(f, d1, d2), practicalR1(f / 1000, d1, d2)); // ITU-R P.526 §2.1
  });
  it('is 11.37 m mid-path on a 10 km 5.8 GHz link', () => {
    within1Pct(midPathFresnelRadiusM(5800, 10), 17.31 * Math.sqrt(25 / (5.8 * 10))); // ITU-R P.526 §2.1 → 11.37 m
  });
  it('the n-th zone grows as sqrt(n)', () => {
    expect(fresnelRadiusM(5800, 3, 3, 4) / fresnelRadiusM(5800, 3, 3, 1)).toBeCloseTo(2, 9); // ITU-R P.526 §2.1: Rn ∝ sqrt(n)
  });
  it('refuses impossible geometry', () => {
    expect(() => fresnelRadiusM(5800, -1, 2)).toThrow(RangeError);
    expect(() => fresnelRadiusM(0, 1, 2)).toThrow(/frequency/);
  });
});

describe('earth bulge', () => {
  it('h = d1·d2 / (12.742·k) with k = 4/3', () => {
    within1Pct(midPathEarthBulgeM(10), 25 / (12.742 * (4 / 3))); // ITU-R P.526: 1.47 m mid-path over 10 km
    within1Pct(earthBulgeM(3, 17), (3 * 17) / (12.742 * (4 / 3))); // ITU-R P.526
    within1Pct(earthBulgeM(10, 10, 1), 100 / 12.742); // ITU-R P.526 with k = 1
  });
  it('uses an effective radius of about 8 500 km', () => {
    within1Pct(EFFECTIVE_EARTH_K * EARTH_RADIUS_KM, 8500); // ITU-R P.526 / IEC 60050 705-05-41
  });
});

describe('clearance', () => {
  it('is 0.6 × first-zone radius + bulge', () => {
    expect(clearanceNeededM(10, 1.5)).toBeCloseTo(7.5, 9); // common practice (60 % of zone 1, ITU-R P.526 §4.1) + bulge
  });
});
