import { describe, expect, it } from 'vitest';
import { computeLinkBudget, type LinkBudgetInput } from '../../../shared/radio/plan';
import { PlanningError } from '../../../shared/radio/errors';
import geographiclib from 'geographiclib-geodesic';

const { Geodesic } = geographiclib;

const radio = { freqMHz: 5800, channelWidthMHz: 20 as const, txPowerDbm: 20, txAntennaGainDbi: 23, txCableLossDb: 1, rxAntennaGainDbi: 23, rxCableLossDb: 1 };

describe('computeLinkBudget with distanceKm only', () => {
  const r = computeLinkBudget({ ...radio, distanceKm: 5 });
  it('returns the API.md answer fields, first and second edition', () => {
    const first = [
      'azimuthDeg',
      'clearanceNeededM',
      'distanceKm',
      'earthBulgeM',
      'eirpDbm',
      'expectedRateMbps',
      'fadeMarginDb',
      'fresnelRadiusM',
      'fsplDb',
      'noiseFloorDbm',
      'reverseAzimuthDeg',
      'rxSignalDbm',
      'snrDb',
      'tiltDeg',
    ];
    const second = ['lineOfSight', 'radioHorizonKm', 'diffractionLossDb', 'roundTripUs', 'warnings', 'terrainUsed'];
    expect(Object.keys(r)).toEqual(expect.arrayContaining([...first, ...second]));
    expect(r.azimuthDeg).toBeNull();
    expect(r.reverseAzimuthDeg).toBeNull();
    expect(r.tiltDeg).toBeNull();
    expect(r.lineOfSight).toBeNull(); // no heights without sites
  });
  it('computes the budget of a 5 km 5.8 GHz backhaul (worked by hand)', () => {
    // ITU-R P.525 §2.2 with the exact constant 32.45: 32.45 + 75.27 + 13.98 = 121.70 dB
    expect(Math.abs(r.fsplDb - 121.7)).toBeLessThan(0.1);
    expect(r.eirpDbm).toBe(42); // REFERENCES Link budget: 20 + 23 − 1
    expect(Math.abs(r.rxSignalDbm - -57.7)).toBeLessThan(0.1); // REFERENCES Link budget: 42 − 121.70 + 23 − 1
    expect(r.noiseFloorDbm).toBeCloseTo(-95.99, 2); // REFERENCES Noise: −174 + 73.01 + NF 5 (API default)
    expect(Math.abs(r.snrDb - 38.29)).toBeLessThan(0.1); // −57.70 − (−95.99)
    expect(r.expectedRateMbps).toBe(65); // −57.7 dBm ≥ −64 dBm → HT20 MCS7, 65 Mb/s (IEEE 802.11-2020 HT tables)
    expect(Math.abs(r.fadeMarginDb - 24.3)).toBeLessThan(0.1); // −57.70 − (−82) (REFERENCES sensitivity table)
    const r1 = 17.31 * Math.sqrt((2.5 * 2.5) / (5.8 * 5)); // ITU-R P.526 §2.1 practical form = 8.04 m
    expect(Math.abs(r.fresnelRadiusM - r1) / r1).toBeLessThan(0.01);
    const bulge = (2.5 * 2.5) / (12.742 * (4 / 3)); // ITU-R P.526 earth bulge, k = 4/3 = 0.368 m
    expect(Math.abs(r.earthBulgeM - bulge) / bulge).toBeLessThan(0.01);
    expect(Math.abs(r.clearanceNeededM - (0.6 * r1 + bulge))).toBeLessThan(0.05); // API.md: 0.6 × F1 + bulge = 5.19 m
    expect(r.roundTripUs).toBeCloseTo(33.356, 3); // 2 × 5000 m / 299 792 458 m/s (definition of c)
  });
  it('honours the noise figure and a wider channel', () => {
    const wide = computeLinkBudget({ ...radio, distanceKm: 5, channelWidthMHz: 40, noiseFigureDb: 7 });
    expect(wide.noiseFloorDbm).toBeCloseTo(-174 + 10 * Math.log10(40e6) + 7, 2); // REFERENCES Noise
    expect(Math.abs(wide.fadeMarginDb - 21.3)).toBeLessThan(0.1); // −57.70 − (−79), 40 MHz MCS0 (REFERENCES: 3 dB above 20 MHz)
    // A receiver noisier than the 10 dB the tables assume (from memory) loses the difference: NF 13 → 3 dB less margin.
    const noisy = computeLinkBudget({ ...radio, distanceKm: 5, noiseFigureDb: 13 });
    expect(noisy.fadeMarginDb).toBeCloseTo(r.fadeMarginDb - 3, 6);
    expect(computeLinkBudget({ ...radio, distanceKm: 30, noiseFigureDb: 15 }).expectedRateMbps).toBeLessThan(
      computeLinkBudget({ ...radio, distanceKm: 30 }).expectedRateMbps,
    );
  });
  it('predicts no rate and a negative margin on a hopeless link', () => {
    const far = computeLinkBudget({ ...radio, txAntennaGainDbi: 2, rxAntennaGainDbi: 2, distanceKm: 40 });
    expect(far.expectedRateMbps).toBe(0);
    expect(far.fadeMarginDb).toBeLessThan(0);
  });
});

describe('computeLinkBudget between two sites', () => {
  const a = { lat: 48.2082, lon: 16.3738, heightM: 12, groundElevationM: 180 };
  const b = { lat: 48.2312, lon: 16.4138, heightM: 9, groundElevationM: 210 };
  it('adds geodesic distance, azimuths and tilt', () => {
    const r = computeLinkBudget({ ...radio, a, b });
    const ref = Geodesic.WGS84.Inverse(a.lat, a.lon, b.lat, b.lon); // Karney 2013 via GeographicLib (outside check)
    expect(r.distanceKm).toBeCloseTo((ref.s12 ?? NaN) / 1000, 3);
    expect(r.azimuthDeg).toBeCloseTo(ref.azi1 ?? NaN, 2);
    expect(r.reverseAzimuthDeg).toBeCloseTo((ref.azi2 ?? NaN) + 180, 2); // arrival heading turned round
    expect(r.tiltDeg).toBeGreaterThan(0); // b's antenna is 27 m higher
  });
  it('prints bearings with two decimals, never 51.19999999999999', () => {
    const start = { lat: 47.3, lon: 8.5 };
    const end = Geodesic.WGS84.Direct(start.lat, start.lon, 51.2, 5000); // GeographicLib direct problem, 5 km at 51.2°
    const r = computeLinkBudget({ ...radio, a: { ...start, heightM: 10 }, b: { lat: end.lat2!, lon: end.lon2!, heightM: 10 } });
    expect(r.azimuthDeg).toBe(51.2);
    for (const v of [r.reverseAzimuthDeg!, r.tiltDeg!]) expect(Number(v.toFixed(3))).toBe(v);
  });
  it('refuses sites farther apart than 500 km, as distanceKm is', () => {
    expect(() => computeLinkBudget({ ...radio, a: { lat: 47, lon: 8, heightM: 10 }, b: { lat: 47, lon: 80, heightM: 10 } })).toThrow(
      /km apart; links are planned up to 500 km/,
    );
  });
  it('refuses two sites in the same place, a lone site, or both forms', () => {
    const expectPlanningError = (input: LinkBudgetInput, code: string) => {
      try {
        computeLinkBudget(input);
        expect.unreachable('should have thrown');
      } catch (e) {
        expect(e).toBeInstanceOf(PlanningError);
        expect((e as PlanningError).status).toBe(400);
        expect((e as PlanningError).code).toBe(code);
      }
    };
    expectPlanningError({ ...radio, a, b: { ...a } }, 'sites_too_close');
    expectPlanningError({ ...radio, a }, 'link_geometry_required');
    expectPlanningError({ ...radio, a, b, distanceKm: 3 }, 'link_geometry_required');
    expectPlanningError({ ...radio, distanceKm: 0 }, 'distance_too_short');
    expectPlanningError({ ...radio, freqMHz: 2437, channelWidthMHz: 80, distanceKm: 1 }, 'no_80mhz_on_24ghz'); // IEEE 802.11-2020 clause 21: VHT is 5 GHz only
  });
});

describe('second edition: line of sight, horizon, diffraction, rates', () => {
  const flat = (km: number, h: number) => {
    const end = Geodesic.WGS84.Direct(47, 8, 0, km * 1000); // due north, GeographicLib
    return { a: { lat: 47, lon: 8, heightM: h, groundElevationM: 0 }, b: { lat: end.lat2!, lon: end.lon2!, heightM: h, groundElevationM: 0 } };
  };
  it('a 55 km path between 30 m masts is blocked by the earth bulge, and says so', () => {
    const r = computeLinkBudget({ ...radio, ...flat(55, 30) });
    // ITU-R P.526 bulge at mid-path, k = 4/3: 27.5² / (12.742 × 4/3) = 44.51 m, so the line (30 m) runs 14.5 m under the raised ground
    expect(r.lineOfSight!.clear).toBe(false);
    expect(Math.abs(r.lineOfSight!.worstClearanceM - (30 - 44.51))).toBeLessThan(0.45); // 1 % of the bulge
    expect(r.lineOfSight!.atDistanceKm).toBeCloseTo(27.5, 0);
    expect(r.warnings.join(' ')).toMatch(/Line of sight blocked.*below the ground/);
    // ITU-R P.530 radio horizon: 4.12 × (√30 + √30) = 45.13 km < 55 km
    expect(r.radioHorizonKm).toBeCloseTo(45.13, 1);
    expect(r.warnings.join(' ')).toMatch(/longer than the radio horizon/);
    expect(r.warnings.join(' ')).toMatch(/ACK timeout\) setting to at least 61 km/); // 55 km + 10 % (common practice)
  });
  it('a path clear at k = 4/3 but not at the worst-case k = 2/3 is warned about (ITU-R P.530)', () => {
    // 20 km at 5.8 GHz between 20 m masts: mid-path bulge 5.9 m (k 4/3) or 11.8 m (k 2/3); 0.6 F1 = 0.6 × 17.31·√(100/(5.8·20)) = 9.64 m
    const r = computeLinkBudget({ ...radio, ...flat(20, 20) });
    expect(r.lineOfSight!.clear).toBe(true);
    expect(r.lineOfSightWorstCase!.clear).toBe(false);
    expect(r.warnings.join(' ')).toMatch(/worst-case refraction/);
  });
  it('knife-edge loss J(ν) for a tree line: J(0) ≈ 6.0 dB when its top just touches the line (ITU-R P.526)', () => {
    // 2 km, masts 10 m on flat ground, obstacle at 1 km: the line is at 10 m, the bulge there 1·1/(12.742·4/3) = 0.0589 m.
    const { a, b } = flat(2, 10);
    const touching = computeLinkBudget({ ...radio, a, b, obstacles: [{ distanceKm: 1, heightM: 10 - 0.0589 }] });
    expect(Math.abs(touching.diffractionLossDb - 6.0)).toBeLessThan(0.1); // REFERENCES: J(0) ≈ 6.0 dB
    // ν = 1: h = 1/√(2/λ·(1/1000 + 1/1000)), λ = c/5.8 GHz = 0.05169 m → h = 3.595 m above the line
    const lambda = 299792458 / 5.8e9;
    const h1 = 1 / Math.sqrt((2 / lambda) * (2 / 1000));
    const blocked = computeLinkBudget({
      ...radio,
      a,
      b,
      obstacles: [
        { distanceKm: 1, heightM: 10 - 0.0589 + h1 },
        { distanceKm: 0.5, heightM: 2 },
      ],
    });
    expect(Math.abs(blocked.diffractionLossDb - 13.9)).toBeLessThan(0.1); // REFERENCES: J(1) ≈ 13.9 dB, the worst obstacle counts
    expect(blocked.rxSignalDbm).toBeCloseTo(touching.rxSignalDbm - (blocked.diffractionLossDb - touching.diffractionLossDb), 1);
    expect(blocked.lineOfSight).toMatchObject({ clear: false, blockedBy: 'obstacle', atDistanceKm: 1 });
    const low = computeLinkBudget({ ...radio, a, b, obstacles: [{ distanceKm: 1, heightM: 0 }] });
    expect(low.diffractionLossDb).toBe(0); // ν ≤ −0.78: no loss (ITU-R P.526)
    expect(() => computeLinkBudget({ ...radio, a, b, obstacles: [{ distanceKm: 3, heightM: 0 }] })).toThrow(
      /obstacles\.0\.distanceKm 3 km is not between the two ends/,
    );
  });
  it('rates from the HT and VHT tables with streams and guard interval (IEEE 802.11-2020 clauses 19 and 21)', () => {
    const strong = { ...radio, distanceKm: 0.5 };
    // REFERENCES: HT40 MCS15 short GI 300 Mb/s
    expect(computeLinkBudget({ ...strong, channelWidthMHz: 40, streams: 2, guardInterval: 'short' }).expectedRateMbps).toBe(300);
    const vht = computeLinkBudget({ ...strong, channelWidthMHz: 80, streams: 2, guardInterval: 'short' });
    expect(vht.expectedRateMbps).toBe(866.7); // REFERENCES: VHT80 MCS9 2 streams short GI 866.7 Mb/s
    expect(vht.mcs).toBe(9);
    expect(computeLinkBudget({ ...strong, guardInterval: 'short' }).expectedRateMbps).toBe(72.2); // REFERENCES Rates: HT20 MCS7 short GI
    expect(computeLinkBudget({ ...strong, channelWidthMHz: 20, streams: 2 }).mcs).toBe(15); // HT numbering: MCS8–15 for two streams
  });
  it('gives the margin against a chosen target rate, and the 20/40/80 MHz trade-off', () => {
    const r = computeLinkBudget({ ...radio, distanceKm: 5, targetRateMbps: 50 });
    // Slowest HT20 rate ≥ 50 Mb/s is MCS5 (52 Mb/s, −66 dBm): −57.70 + 66 = 8.30 dB
    expect(Math.abs(r.targetMarginDb! - 8.3)).toBeLessThan(0.1);
    expect(r.warnings.join(' ')).toMatch(/Only 8\.3 dB of margin at the target 52 Mb\/s/);
    expect(r.widthOptions.map((w) => w.channelWidthMHz)).toEqual([20, 40, 80]);
    // Same signal, 3 dB more sensitivity needed per doubling (REFERENCES): MCS0 margins 24.3, 21.3, 18.3 dB
    expect(r.widthOptions.map((w) => Math.round(w.fadeMarginDb * 10) / 10)).toEqual([24.3, 21.3, 18.3]);
    const r24 = computeLinkBudget({ ...radio, freqMHz: 2437, distanceKm: 1 });
    expect(r24.widthOptions.map((w) => w.channelWidthMHz)).toEqual([20, 40]); // no 80 MHz on 2.4 GHz
  });
  it('warns when the link budget’s own EIRP is over the region’s limit', () => {
    const r = computeLinkBudget({ ...radio, freqMHz: 5500, distanceKm: 5, region: 'EU' }); // 42 dBm EIRP vs 30 dBm (ETSI EN 301 893)
    expect(r.warnings.join(' ')).toMatch(/EU rules: .*exceeds the limit/);
    expect(r.warnings.join(' ')).toMatch(/DFS/);
  });
});
