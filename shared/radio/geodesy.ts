import geographiclib from 'geographiclib-geodesic';
import { EARTH_RADIUS_KM, EFFECTIVE_EARTH_K } from './fresnel';

// The package is CommonJS; a default import works under Node's ESM loader and in Vite alike.
const { Geodesic } = geographiclib;

export interface GeoPoint {
  lat: number;
  lon: number;
}
export interface MastPoint extends GeoPoint {
  /** Antenna height above ground. */
  heightM: number;
  groundElevationM?: number;
}

/** Bring any angle into [0, 360). */
export function normaliseBearingDeg(deg: number): number {
  const r = ((deg % 360) + 360) % 360;
  return r === 360 ? 0 : r;
}

// Inverse geodesic problem on WGS84, Karney "Algorithms for geodesics", J. Geodesy 87 (2013) via GeographicLib.
export function geodesicInverse(a: GeoPoint, b: GeoPoint): { distanceKm: number; azimuthDeg: number; reverseAzimuthDeg: number } {
  const r = Geodesic.WGS84.Inverse(a.lat, a.lon, b.lat, b.lon);
  const s12 = r.s12 ?? NaN;
  const azi1 = r.azi1 ?? NaN;
  const azi2 = r.azi2 ?? NaN;
  // azi2 is the heading on arrival at b, so the bearing from b back to a is its opposite.
  return { distanceKm: s12 / 1000, azimuthDeg: normaliseBearingDeg(azi1), reverseAzimuthDeg: normaliseBearingDeg(azi2 + 180) };
}

export function geodesicDistanceKm(a: GeoPoint, b: GeoPoint): number {
  return geodesicInverse(a, b).distanceKm;
}

// Great-circle distance on a sphere (haversine); a cross-check only: it differs from the geodesic by up to ~0.5 %.
export function haversineDistanceKm(a: GeoPoint, b: GeoPoint, radiusKm = 6371.0088): number {
  const rad = Math.PI / 180;
  const dLat = (b.lat - a.lat) * rad;
  const dLon = (b.lon - a.lon) * rad;
  const h = Math.sin(dLat / 2) ** 2 + Math.cos(a.lat * rad) * Math.cos(b.lat * rad) * Math.sin(dLon / 2) ** 2;
  return 2 * radiusKm * Math.asin(Math.min(1, Math.sqrt(h)));
}

// Elevation angle with earth curvature, after ITU-R P.452's θ = (h2 − h1)/d − d/(2·a_e), a_e = k·R (from memory).
// Convention: degrees above the horizontal at a toward b; positive tilts up, negative is down-tilt.
export function antennaTiltDeg(a: MastPoint, b: MastPoint, distanceKm: number, k = EFFECTIVE_EARTH_K): number {
  if (!(distanceKm > 0)) throw new RangeError('distance must be greater than 0 km');
  const heightA = (a.groundElevationM ?? 0) + a.heightM;
  const heightB = (b.groundElevationM ?? 0) + b.heightM;
  const distanceM = distanceKm * 1000;
  const effectiveRadiusM = k * EARTH_RADIUS_KM * 1000;
  const rad = Math.atan2(heightB - heightA, distanceM) - distanceM / (2 * effectiveRadiusM);
  return (rad * 180) / Math.PI;
}

/** n + 1 points evenly spaced along the WGS84 geodesic from a to b (GeographicLib InverseLine), with their distance from a. */
export function geodesicPoints(a: GeoPoint, b: GeoPoint, n: number): (GeoPoint & { distanceKm: number })[] {
  const line = Geodesic.WGS84.InverseLine(a.lat, a.lon, b.lat, b.lon);
  const total = line.s13 ?? NaN;
  return Array.from({ length: n + 1 }, (_, i) => {
    const s = (i / n) * total;
    const p = line.Position(s);
    return { lat: p.lat2 ?? NaN, lon: p.lon2 ?? NaN, distanceKm: s / 1000 };
  });
}
