import { earthBulgeM, fresnelRadiusM } from './fresnel';

export interface PathProfileInput {
  distanceKm: number;
  freqMHz: number;
  /** Ground elevation and mast height at each end, metres. */
  aGroundM: number;
  aHeightM: number;
  bGroundM: number;
  bHeightM: number;
  samples?: number;
}
export interface ProfilePoint {
  dKm: number;
  /** Flat-earth ground line between the two sites' elevations, raised by the earth bulge (k = 4/3). */
  groundM: number;
  bulgeM: number;
  /** Straight line of sight between the two antennas. */
  sightM: number;
  fresnelM: number;
}

/**
 * A side view of the path: the line of sight, the first Fresnel zone around it (ITU-R P.526 Annex 1 §2.1)
 * and the ground raised by the earth bulge (ITU-R P.526, k = 4/3), sampled along the path. No terrain data:
 * the ground between the sites is drawn straight, so obstacles must be checked on site.
 */
export function pathProfile(input: PathProfileInput): ProfilePoint[] {
  const n = Math.max(2, input.samples ?? 40);
  const aTop = input.aGroundM + input.aHeightM;
  const bTop = input.bGroundM + input.bHeightM;
  return Array.from({ length: n + 1 }, (_, i) => {
    const t = i / n;
    const dKm = t * input.distanceKm;
    const d2Km = input.distanceKm - dKm;
    const bulgeM = earthBulgeM(dKm, Math.max(0, d2Km));
    const fresnelM = dKm === 0 || d2Km <= 0 ? 0 : fresnelRadiusM(input.freqMHz, dKm, d2Km);
    return {
      dKm,
      groundM: input.aGroundM + t * (input.bGroundM - input.aGroundM) + bulgeM,
      bulgeM,
      sightM: aTop + t * (bTop - aTop),
      fresnelM,
    };
  });
}

/** The smallest clearance along the path between the line of sight and 60 % of the first zone over the raised ground. */
export function worstClearanceM(points: ProfilePoint[]): number {
  return Math.min(...points.map((p) => p.sightM - 0.6 * p.fresnelM - p.groundM));
}
