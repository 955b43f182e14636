import { earthBulgeM, fresnelRadiusM, FRESNEL_CLEARANCE_FRACTION } from './fresnel';
import { SPEED_OF_LIGHT_M_PER_S, wavelengthM } from './pathLoss';
import type { PathProfileInput } from './pathProfile';

/** Worst-case effective-earth factor for temperate climates (ITU-R P.530 clearance planning). */
export const WORST_CASE_K = 2 / 3;

export interface Obstacle {
  /** Distance from end a. */
  distanceKm: number;
  /** Height of the obstacle's top above the datum of the ground elevations. */
  heightM: number;
}
export interface GroundPoint {
  distanceKm: number;
  groundM: number;
}
export interface PathInput extends PathProfileInput {
  kFactor: number;
  obstacles?: Obstacle[];
  /** Ground from elevation tiles; without it the ground runs straight between the two ends. */
  terrain?: GroundPoint[];
}
export interface LineOfSight {
  clear: boolean;
  /** Height of the line between antenna tops above the worst point (ground or obstacle, raised by the bulge). */
  worstClearanceM: number;
  /** 0.6 × first Fresnel radius at that point. */
  requiredClearanceM: number;
  atDistanceKm: number;
  /** What the worst point is. */
  blockedBy: 'ground' | 'obstacle';
}

/** Ground under the path at d km: tile profile (linear between samples) or a straight line between the ends. */
export function groundAtM(input: PathInput, dKm: number): number {
  const t = input.terrain;
  if (!t || t.length < 2) return input.aGroundM + (dKm / input.distanceKm) * (input.bGroundM - input.aGroundM);
  let i = 1;
  while (i < t.length - 1 && t[i].distanceKm < dKm) i++;
  const p = t[i - 1];
  const q = t[i];
  const span = q.distanceKm - p.distanceKm;
  return span > 0 ? p.groundM + ((dKm - p.distanceKm) / span) * (q.groundM - p.groundM) : p.groundM;
}

/** Height of the straight line between the antenna tops at d km (datum of the ground elevations). */
export function sightLineM(input: PathInput, dKm: number): number {
  const aTop = input.aGroundM + input.aHeightM;
  const bTop = input.bGroundM + input.bHeightM;
  return aTop + (dKm / input.distanceKm) * (bTop - aTop);
}

/**
 * Clearance of the line of sight over ground and obstacles, each raised by the earth bulge for k (ITU-R P.526
 * h = d1·d2/(12.742·k)); clear when every point keeps 0.6 of the first Fresnel zone (common practice, ITU-R P.526 §4.1).
 * The worst point is the one with the least clearance beyond what it needs.
 */
export function lineOfSight(input: PathInput, k = input.kFactor): LineOfSight {
  const n = Math.max(100, input.samples ?? 200);
  const D = input.distanceKm;
  const candidates: { dKm: number; topM: number; blockedBy: 'ground' | 'obstacle' }[] = [];
  for (let i = 1; i < n; i++) candidates.push({ dKm: (i / n) * D, topM: groundAtM(input, (i / n) * D), blockedBy: 'ground' });
  for (const p of input.terrain ?? []) if (p.distanceKm > 0 && p.distanceKm < D) candidates.push({ dKm: p.distanceKm, topM: p.groundM, blockedBy: 'ground' });
  for (const o of input.obstacles ?? []) candidates.push({ dKm: o.distanceKm, topM: o.heightM, blockedBy: 'obstacle' });
  let worst: LineOfSight | null = null;
  let worstSlack = Infinity;
  for (const c of candidates) {
    const clearance = sightLineM(input, c.dKm) - (c.topM + earthBulgeM(c.dKm, D - c.dKm, k));
    const required = FRESNEL_CLEARANCE_FRACTION * fresnelRadiusM(input.freqMHz, c.dKm, D - c.dKm);
    if (clearance - required < worstSlack) {
      worstSlack = clearance - required;
      worst = { clear: false, worstClearanceM: clearance, requiredClearanceM: required, atDistanceKm: c.dKm, blockedBy: c.blockedBy };
    }
  }
  if (!worst) throw new RangeError('a path needs a length');
  return { ...worst, clear: worstSlack >= 0 };
}

// Radio horizon for k = 4/3, ITU-R P.530 practice: d ≈ 4.12·(√h1 + √h2) km with heights in metres.
export function radioHorizonKm(h1M: number, h2M: number): number {
  return 4.12 * (Math.sqrt(Math.max(0, h1M)) + Math.sqrt(Math.max(0, h2M)));
}

// ITU-R P.526 single knife-edge: J(ν) = 6.9 + 20·log10(√((ν−0.1)² + 1) + ν − 0.1) for ν > −0.78, else 0 dB.
export function knifeEdgeLossDb(nu: number): number {
  if (nu <= -0.78) return 0;
  return 6.9 + 20 * Math.log10(Math.sqrt((nu - 0.1) ** 2 + 1) + nu - 0.1);
}

// ITU-R P.526: ν = h·√(2/λ · (1/d1 + 1/d2)), h the obstacle's height above the line (negative below it), d in metres.
export function fresnelKirchhoffNu(hM: number, d1Km: number, d2Km: number, freqMHz: number): number {
  return hM * Math.sqrt((2 / wavelengthM(freqMHz)) * (1 / (d1Km * 1000) + 1 / (d2Km * 1000)));
}

/** The obstacle with the largest ν (its top raised by the bulge for k) and its knife-edge loss; 0 dB without obstacles. */
export function worstKnifeEdge(input: PathInput, k = input.kFactor): { lossDb: number; nu: number | null; obstacle: Obstacle | null } {
  let best: { nu: number; obstacle: Obstacle } | null = null;
  for (const o of input.obstacles ?? []) {
    const h = o.heightM + earthBulgeM(o.distanceKm, input.distanceKm - o.distanceKm, k) - sightLineM(input, o.distanceKm);
    const nu = fresnelKirchhoffNu(h, o.distanceKm, input.distanceKm - o.distanceKm, input.freqMHz);
    if (!best || nu > best.nu) best = { nu, obstacle: o };
  }
  return best ? { lossDb: knifeEdgeLossDb(best.nu), nu: best.nu, obstacle: best.obstacle } : { lossDb: 0, nu: null, obstacle: null };
}

// Round trip of a radio signal over the path, 2·d / c.
export function roundTripUs(distanceKm: number): number {
  return ((2 * distanceKm * 1000) / SPEED_OF_LIGHT_M_PER_S) * 1e6;
}

/** Links longer than this usually need the radio's distance (ACK timeout) setting raised (common practice, no source). */
export const ACK_DISTANCE_WARNING_KM = 3;
/** The distance setting to enter: the path plus 10 %, rounded up to a whole km (common practice, no source). */
export function ackDistanceSettingKm(distanceKm: number): number {
  // Rounded to 1 mm first, so 50 km × 1.1 = 55.000000000000007 asks for 55 km, not 56.
  return Math.ceil(Math.round(distanceKm * 1.1 * 1e6) / 1e6);
}
