import { describe, expect, it } from 'vitest';
import { computeLinkBudget, type LinkBudgetInput } from '../../../shared/radio/plan';
import { PlanningError } from '../../../shared/radio/errors';
import { geodesicInverse } from '../../../shared/radio/geodesy';

const radio = { freqMHz: 5800, channelWidthMHz: 20 as const, txPowerDbm: 20, txAntennaGainDbi: 23, txCableLossDb: 1, rxAntennaGainDbi: 23, rxCableLossDb: 1 };

describe('computeLinkBudget with distanceKm only', () => {
  const r = computeLinkBudget({ ...radio, distanceKm: 5 });
  it('returns exactly the API.md answer fields', () => {
    expect(Object.keys(r).sort()).toEqual(
      ['azimuthDeg', 'clearanceNeededM', 'distanceKm', 'earthBulgeM', 'eirpDbm', 'expectedRateMbps', 'fadeMarginDb', 'fresnelRadiusM', 'fsplDb', 'noiseFloorDbm', 'reverseAzimuthDeg', 'rxSignalDbm', 'snrDb', 'tiltDeg'].sort(),
    );
    expect(r.azimuthDeg).toBeNull();
    expect(r.reverseAzimuthDeg).toBeNull();
    expect(r.tiltDeg).toBeNull();
  });
  it('computes the budget of a 5 km 5.8 GHz backhaul', () => {
    const fspl = 32.4 + 20 * Math.log10(5800) + 20 * Math.log10(5); // ITU-R P.525 §2.2 as printed
    expect(Math.abs(r.fsplDb - fspl)).toBeLessThan(0.1); // ITU-R P.525 §2.2, 0.1 dB
    expect(r.eirpDbm).toBe(42); // REFERENCES Link budget: 20 + 23 − 1
    expect(Math.abs(r.rxSignalDbm - (42 - fspl + 23 - 1))).toBeLessThan(0.1); // REFERENCES Link budget: Prx
    expect(r.noiseFloorDbm).toBeCloseTo(-95.99, 2); // REFERENCES Noise: −174 + 73.01 + NF 5 (API default)
    expect(r.snrDb).toBeCloseTo(r.rxSignalDbm - r.noiseFloorDbm, 6); // REFERENCES Noise: SNR = Prx − N
    expect(r.expectedRateMbps).toBe(65); // −57.7 dBm ≥ −64 dBm → HT20 MCS7 (REFERENCES sensitivity table)
    expect(r.fadeMarginDb).toBeCloseTo(r.rxSignalDbm + 82, 6); // fade margin vs MCS0 −82 dBm (REFERENCES)
    const r1 = 17.31 * Math.sqrt((2.5 * 2.5) / (5.8 * 5)); // ITU-R P.526 §2.1 practical form
    expect(Math.abs(r.fresnelRadiusM - r1) / r1).toBeLessThan(0.01);
    const bulge = (2.5 * 2.5) / (12.742 * (4 / 3)); // ITU-R P.526 earth bulge, k = 4/3
    expect(Math.abs(r.earthBulgeM - bulge) / bulge).toBeLessThan(0.01);
    expect(r.clearanceNeededM).toBeCloseTo(0.6 * r.fresnelRadiusM + r.earthBulgeM, 1); // API.md clearance
  });
  it('honours the noise figure and a wider channel', () => {
    const wide = computeLinkBudget({ ...radio, distanceKm: 5, channelWidthMHz: 40, noiseFigureDb: 7 });
    expect(wide.noiseFloorDbm).toBeCloseTo(-174 + 10 * Math.log10(40e6) + 7, 2); // REFERENCES Noise
    expect(wide.fadeMarginDb).toBeCloseTo(wide.rxSignalDbm + 79, 6); // 40 MHz MCS0 −79 dBm
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
    const ref = geodesicInverse(a, b); // Karney 2013 via GeographicLib
    expect(r.distanceKm).toBeCloseTo(ref.distanceKm, 3);
    expect(r.azimuthDeg).toBeCloseTo(ref.azimuthDeg, 2);
    expect(r.reverseAzimuthDeg).toBeCloseTo(ref.reverseAzimuthDeg, 2);
    expect(Math.abs(((r.reverseAzimuthDeg! - r.azimuthDeg! + 360) % 360) - 180)).toBeLessThan(0.1); // short path: nearly opposite
    expect(r.tiltDeg).toBeGreaterThan(0); // b's antenna is 27 m higher
    const same = computeLinkBudget({ ...radio, distanceKm: ref.distanceKm });
    expect(r.fsplDb).toBeCloseTo(same.fsplDb, 2);
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
  });
});
