import { describe, expect, it } from 'vitest';
import { Geodesic } from 'geographiclib-geodesic';
import { antennaTiltDeg, geodesicInverse, haversineDistanceKm, normaliseBearingDeg } from '../../../shared/radio/geodesy';

const dms = (d: number, m: number, s: number) => d + m / 60 + s / 3600;
// GeodSolve(1) man page, EXAMPLES: JFK 40:38:23N 073:46:44W → Changi 01:21:33N 103:59:22E.
const JFK = { lat: dms(40, 38, 23), lon: -dms(73, 46, 44) };
const SIN = { lat: dms(1, 21, 33), lon: dms(103, 59, 22) };

describe('WGS84 geodesic (Karney 2013, GeographicLib)', () => {
  it('reproduces the GeodSolve worked example JFK → Singapore', () => {
    const g = geodesicInverse(JFK, SIN);
    // GeodSolve man page: "003:18:29.9 177:29:09.2 15347628" (printed to 0.1″ and 1 m)
    expect(Math.abs(g.distanceKm * 1000 - 15347628)).toBeLessThan(1);
    expect(Math.abs(g.azimuthDeg - dms(3, 18, 29.9))).toBeLessThan(0.1 / 3600);
    // reverse bearing b→a is the arrival azimuth turned round: 177°29′09.2″ + 180°
    expect(Math.abs(g.reverseAzimuthDeg - (dms(177, 29, 9.2) + 180))).toBeLessThan(0.1 / 3600);
  });

  it('reproduces the geographiclib-geodesic README example Wellington → Salamanca', () => {
    const g = geodesicInverse({ lat: -41.32, lon: 174.81 }, { lat: 40.96, lon: -5.5 });
    expect(Math.abs(g.distanceKm * 1000 - 19959679.267)).toBeLessThan(0.001); // geographiclib-geodesic README: 19959679.267 m
  });

  it('the reverse azimuth is the forward azimuth of the reverse problem, within [0, 360)', () => {
    const a = { lat: 51.4801, lon: -0.0104 };
    const b = { lat: 51.5201, lon: -0.1604 };
    const ab = geodesicInverse(a, b);
    const ba = geodesicInverse(b, a);
    const ref = Geodesic.WGS84.Inverse(b.lat, b.lon, a.lat, a.lon); // GeographicLib called directly (outside check)
    expect(ab.reverseAzimuthDeg).toBeCloseTo(normaliseBearingDeg(ref.azi1 ?? NaN), 9); // Karney 2013: geodesic b→a is a→b reversed
    expect(ab.distanceKm * 1000).toBeCloseTo(ref.s12 ?? NaN, 6);
    for (const v of [ab.azimuthDeg, ab.reverseAzimuthDeg, ba.azimuthDeg]) {
      expect(v).toBeGreaterThanOrEqual(0);
      expect(v).toBeLessThan(360);
    }
    expect(ab.azimuthDeg).toBeGreaterThan(270); // b lies west-north-west of a
  });

  it('agrees with GeographicLib called directly (outside check)', () => {
    const pairs = [
      [
        [-33.86, 151.21],
        [-33.9, 151.3],
      ],
      [
        [64.1, -21.9],
        [64.2, -21.5],
      ],
      [
        [0.5, 179.9],
        [0.4, -179.95],
      ],
    ] as const;
    for (const [[lat1, lon1], [lat2, lon2]] of pairs) {
      const ref = Geodesic.WGS84.Inverse(lat1, lon1, lat2, lon2);
      const g = geodesicInverse({ lat: lat1, lon: lon1 }, { lat: lat2, lon: lon2 });
      expect(g.distanceKm * 1000).toBeCloseTo(ref.s12 ?? NaN, 6);
      expect(g.azimuthDeg).toBeCloseTo(normaliseBearingDeg(ref.azi1 ?? NaN), 9);
    }
  });

  it('haversine on a 6 371 008.8 m sphere stays within 0.5 % of the geodesic', () => {
    // REFERENCES Distance and bearing: the sphere differs from WGS84 by up to about 0.5 %
    const cases = [
      [JFK, SIN],
      [
        { lat: -41.32, lon: 174.81 },
        { lat: 40.96, lon: -5.5 },
      ],
      [
        { lat: 60, lon: 10 },
        { lat: 60.05, lon: 10.1 },
      ],
      [
        { lat: 0, lon: 0 },
        { lat: 0, lon: 0.1 },
      ],
      [
        { lat: 45, lon: 7 },
        { lat: 45.1, lon: 7 },
      ],
    ];
    for (const [a, b] of cases) {
      const geo = (Geodesic.WGS84.Inverse(a.lat, a.lon, b.lat, b.lon).s12 ?? NaN) / 1000; // GeographicLib (outside check)
      expect(Math.abs(haversineDistanceKm(a, b) - geo) / geo).toBeLessThan(0.005);
    }
  });

  it('the sphere is worst north–south at the equator: just over 0.5 %', () => {
    // REFERENCES says "up to about 0.5 %": the meridian's curvature radius at the equator is ~6 335 km, so 0.56 %
    const a = { lat: 0, lon: 0 };
    const b = { lat: 0.1, lon: 0 };
    const geo = (Geodesic.WGS84.Inverse(0, 0, 0.1, 0).s12 ?? NaN) / 1000; // GeographicLib (outside check)
    const error = (haversineDistanceKm(a, b) - geo) / geo;
    expect(error).toBeGreaterThan(0.005);
    expect(error).toBeLessThan(0.006);
  });
});

describe('bearing normalisation', () => {
  it('maps any angle into [0, 360)', () => {
    expect(normaliseBearingDeg(-90)).toBe(270);
    expect(normaliseBearingDeg(360)).toBe(0);
    expect(normaliseBearingDeg(725)).toBe(5);
  });
});

describe('antenna tilt with earth curvature (k = 4/3)', () => {
  const kR = (4 / 3) * 6371000;
  it('points slightly down between equal masts: −d/(2·k·R)', () => {
    const tilt = antennaTiltDeg({ lat: 0, lon: 0, heightM: 10 }, { lat: 0, lon: 0, heightM: 10 }, 10);
    // ITU-R P.452 elevation angle θ = Δh/d − d/(2·a_e), a_e = k·R (from memory): −10 000/(2·8 494 667) rad
    expect(tilt).toBeCloseTo((-10000 / (2 * kR)) * (180 / Math.PI), 9);
    expect(tilt).toBeCloseTo(-0.0337, 4);
  });
  it('adds ground elevation to mast height and tilts up toward a higher site', () => {
    const a = { lat: 0, lon: 0, heightM: 12, groundElevationM: 40 };
    const b = { lat: 0, lon: 0, heightM: 8, groundElevationM: 144 };
    const tilt = antennaTiltDeg(a, b, 1);
    // Δh = (144 + 8) − (40 + 12) = 100 m over 1 km: atan(0.1) − 1000/(2·k·R) rad (ITU-R P.452, from memory)
    expect(tilt).toBeCloseTo((Math.atan(0.1) - 1000 / (2 * kR)) * (180 / Math.PI), 9);
    expect(antennaTiltDeg(b, a, 1)).toBeLessThan(-5.7); // and down looking back
  });
  it('refuses a zero distance', () => {
    expect(() => antennaTiltDeg({ lat: 0, lon: 0, heightM: 1 }, { lat: 0, lon: 0, heightM: 1 }, 0)).toThrow(RangeError);
  });
});
