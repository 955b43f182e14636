export const SPEED_OF_LIGHT_M_PER_S = 299_792_458;

/**
 * 20·log10(4π·10⁹/c) ≈ 32.4478 dB: the exact constant for f in MHz and d in km
 * (ITU-R P.525 Annex 1 §2.2 rounds it to 32.4). Pinned once here so every caller agrees.
 */
export const FSPL_CONSTANT_DB = 20 * Math.log10((4 * Math.PI * 1e9) / SPEED_OF_LIGHT_M_PER_S);

// Free-space basic transmission loss, ITU-R P.525 Annex 1 §2.2: L = 32.45 + 20·log10 f(MHz) + 20·log10 d(km).
export function freeSpacePathLossDb(freqMHz: number, distanceKm: number): number {
  if (!(freqMHz > 0)) throw new RangeError('frequency must be greater than 0 MHz');
  if (!(distanceKm > 0)) throw new RangeError('distance must be greater than 0 km');
  return FSPL_CONSTANT_DB + 20 * Math.log10(freqMHz) + 20 * Math.log10(distanceKm);
}

/** Wavelength in metres for a frequency in MHz (λ = c / f). */
export function wavelengthM(freqMHz: number): number {
  return SPEED_OF_LIGHT_M_PER_S / (freqMHz * 1e6);
}
