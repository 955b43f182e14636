import { SPEED_OF_LIGHT_M_PER_S } from './pathLoss';

/** Effective-earth factor for standard refraction (ITU-R P.526). */
export const EFFECTIVE_EARTH_K = 4 / 3;
/** Mean earth radius; 2·R = 12.742 (10³ km), the constant of the bulge formula. */
export const EARTH_RADIUS_KM = 6371;
/** Share of the first Fresnel zone kept clear: common practice (≈0 dB knife-edge loss, ITU-R P.526 §4.1). */
export const FRESNEL_CLEARANCE_FRACTION = 0.6;

// Radius of the n-th Fresnel zone, ITU-R P.526 Annex 1 §2.1: Rn = sqrt(n·λ·d1·d2/(d1+d2)).
export function fresnelRadiusM(freqMHz: number, d1Km: number, d2Km: number, zone = 1): number {
  if (!(freqMHz > 0)) throw new RangeError('frequency must be greater than 0 MHz');
  if (d1Km < 0 || d2Km < 0 || !(d1Km + d2Km > 0)) throw new RangeError('distances must be 0 km or more and not both 0');
  const lambdaM = SPEED_OF_LIGHT_M_PER_S / (freqMHz * 1e6);
  return Math.sqrt((zone * lambdaM * d1Km * 1e3 * d2Km * 1e3) / ((d1Km + d2Km) * 1e3));
}

/** First Fresnel zone radius at the middle of a path (where it is widest). */
export function midPathFresnelRadiusM(freqMHz: number, distanceKm: number): number {
  return fresnelRadiusM(freqMHz, distanceKm / 2, distanceKm / 2);
}

// Earth bulge above the chord, ITU-R P.526: h[m] = d1·d2 / (12.742·k) with distances in km.
export function earthBulgeM(d1Km: number, d2Km: number, k = EFFECTIVE_EARTH_K): number {
  if (d1Km < 0 || d2Km < 0) throw new RangeError('distances must be 0 km or more');
  if (!(k > 0)) throw new RangeError('k must be greater than 0');
  return (d1Km * d2Km * 1e3) / (2 * EARTH_RADIUS_KM * k);
}

export function midPathEarthBulgeM(distanceKm: number, k = EFFECTIVE_EARTH_K): number {
  return earthBulgeM(distanceKm / 2, distanceKm / 2, k);
}

/** Height the line of sight must clear above obstacles: 60 % of the first zone (common practice) plus the bulge. */
export function clearanceNeededM(fresnelRadius: number, bulgeM: number): number {
  return FRESNEL_CLEARANCE_FRACTION * fresnelRadius + bulgeM;
}
