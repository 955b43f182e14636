import { describe, expect, it } from 'vitest';
import { FSPL_CONSTANT_DB, freeSpacePathLossDb, wavelengthM } from '../../../shared/radio/pathLoss';

const LOSS_TOLERANCE_DB = 0.1;
// ITU-R P.525 Annex 1 §2.2 as printed: L = 32.4 + 20·log10 f(MHz) + 20·log10 d(km).
const publishedFspl = (fMHz: number, dKm: number) => 32.4 + 20 * Math.log10(fMHz) + 20 * Math.log10(dKm);

describe('free-space path loss', () => {
  it('pins the exact constant 20·log10(4π·10⁹/c)', () => {
    expect(FSPL_CONSTANT_DB).toBeCloseTo(32.4478, 4); // REFERENCES: exact constant 32.4478
  });

  it.each([
    [2412, 0.5],
    [2437, 1],
    [5180, 3.2],
    [5800, 10],
    [5500, 42],
  ])('matches the ITU-R P.525 formula at %d MHz over %d km within 0.1 dB', (f, d) => {
    expect(Math.abs(freeSpacePathLossDb(f, d) - publishedFspl(f, d))).toBeLessThan(LOSS_TOLERANCE_DB); // ITU-R P.525 §2.2
  });

  it('is 100.05 dB at 2400 MHz over 1 km', () => {
    expect(freeSpacePathLossDb(2400, 1)).toBeCloseTo(32.4478 + 20 * Math.log10(2400), 4); // ITU-R P.525 §2.2, exact constant
    expect(Math.abs(freeSpacePathLossDb(2400, 1) - 100.05)).toBeLessThan(LOSS_TOLERANCE_DB); // ITU-R P.525 §2.2
  });

  it('adds 6.02 dB when distance or frequency doubles', () => {
    // REFERENCES (ITU-R P.525): doubling distance or frequency adds 6.02 dB
    expect(freeSpacePathLossDb(2437, 4) - freeSpacePathLossDb(2437, 2)).toBeCloseTo(6.02, 2);
    expect(freeSpacePathLossDb(4874, 2) - freeSpacePathLossDb(2437, 2)).toBeCloseTo(6.02, 2);
  });

  it('refuses zero or negative distance and frequency', () => {
    expect(() => freeSpacePathLossDb(2437, 0)).toThrow(/distance/);
    expect(() => freeSpacePathLossDb(2437, -1)).toThrow(RangeError);
    expect(() => freeSpacePathLossDb(0, 1)).toThrow(/frequency/);
  });

  it('gives the wavelength λ = c/f', () => {
    expect(wavelengthM(2400)).toBeCloseTo(0.1249, 4); // λ = c/f with c = 299 792 458 m/s (SI definition)
  });
});
