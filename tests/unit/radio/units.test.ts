import { describe, expect, it } from 'vitest';
import { dbmToMw, dbToRatio, mwToDbm } from '../../../shared/radio/units';

describe('dBm and mW', () => {
  it('converts the reference points both ways', () => {
    expect(dbmToMw(20)).toBeCloseTo(100, 9); // REFERENCES Units: 20 dBm = 100 mW
    expect(dbmToMw(30)).toBeCloseTo(1000, 9); // REFERENCES Units: 30 dBm = 1 W
    expect(mwToDbm(100)).toBeCloseTo(20, 9); // dBm = 10·log10(mW)
    expect(mwToDbm(1)).toBe(0); // dBm = 10·log10(mW): 1 mW is 0 dBm
    expect(dbToRatio(3)).toBeCloseTo(1.995, 3); // definition of the decibel: 3 dB ≈ ×2
  });

  it('refuses power that has no dBm value', () => {
    expect(() => mwToDbm(0)).toThrow(/greater than 0 mW/);
    expect(() => mwToDbm(-5)).toThrow(RangeError);
  });
});
