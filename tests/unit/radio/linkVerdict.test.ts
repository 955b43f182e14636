import { describe, expect, it } from 'vitest';
import { assessLinkHealth, linkVerdict, marginBand } from '../../../shared/radio/linkVerdict';
import { pathProfile, worstClearanceM } from '../../../shared/radio/pathProfile';

describe('link verdict', () => {
  it('bands the fade margin at 20 dB and 10 dB, one scale with the map (common practice, no source)', () => {
    expect(linkVerdict(20)).toBe('comfortable');
    expect(linkVerdict(12)).toBe('thin'); // the planning page and the map now agree on a 12 dB margin
    expect(marginBand(12)).toBe('thin');
    expect(linkVerdict(10)).toBe('thin');
    expect(linkVerdict(9.99)).toBe('at-risk');
    expect(linkVerdict(-5)).toBe('at-risk');
    expect(marginBand(null)).toBe('unknown');
  });

  it('flags only a link well below both its prediction and its own baseline (common practice, no source)', () => {
    expect(assessLinkHealth({ measuredSignalDbm: -70, predictedSignalDbm: -55, baselineSignalDbm: -60 })).toEqual({
      belowPredictionDb: 15,
      belowBaselineDb: 10,
      flagged: true,
    });
    expect(assessLinkHealth({ measuredSignalDbm: -70, predictedSignalDbm: -55, baselineSignalDbm: -66 }).flagged).toBe(false); // always weak
    // prediction was optimistic only 8 dB
    expect(assessLinkHealth({ measuredSignalDbm: -70, predictedSignalDbm: -62, baselineSignalDbm: -55 }).flagged).toBe(false);
    // exactly 10 dB is not "more than"
    expect(assessLinkHealth({ measuredSignalDbm: -70, predictedSignalDbm: -60, baselineSignalDbm: -64 }).flagged).toBe(false);
    expect(assessLinkHealth({ measuredSignalDbm: null, predictedSignalDbm: -55, baselineSignalDbm: -60 })).toEqual({
      belowPredictionDb: null,
      belowBaselineDb: null,
      flagged: false,
    });
  });
});

describe('path profile', () => {
  const input = { distanceKm: 10, freqMHz: 5800, aGroundM: 20, aHeightM: 30, bGroundM: 40, bHeightM: 10 };
  const points = pathProfile({ ...input, samples: 10 });

  it('runs the line of sight from mast top to mast top', () => {
    expect(points[0].sightM).toBe(50);
    expect(points[10].sightM).toBe(50);
    expect(points[0].fresnelM).toBe(0);
    expect(points[10].bulgeM).toBe(0);
  });

  it('matches the practical first-zone radius at mid-path within 1 % (ITU-R P.526 Annex 1 §2.1: R1 = 17.31·sqrt(d1·d2/(f·D)))', () => {
    const practical = 17.31 * Math.sqrt((5 * 5) / (5.8 * 10));
    expect(Math.abs(points[5].fresnelM - practical) / practical).toBeLessThan(0.01);
  });

  it('raises the mid-path ground by the earth bulge within 1 % (ITU-R P.526: h = d1·d2/(12.742·k), k = 4/3)', () => {
    const bulge = (5 * 5) / (12.742 * (4 / 3));
    expect(Math.abs(points[5].bulgeM - bulge) / bulge).toBeLessThan(0.01);
    expect(Math.abs(points[5].groundM - (30 + bulge)) / (30 + bulge)).toBeLessThan(0.01); // straight ground between 20 m and 40 m, plus 1.47 m
  });

  it('finds the worst clearance where the bulge and zone are largest, worked by hand', () => {
    // The ground rises toward b (20 → 40 m) under a level line at 50 m. At 9 km: ground 38 m + bulge 9·1/(12.742·4/3) = 0.53 m,
    // 0.6 × F1 = 0.6 × 17.31·√(9/58) = 4.09 m (ITU-R P.526) → 50 − 38.53 − 4.09 = 7.38 m; at 8 km 7.61 m, at 5 km 11.71 m.
    expect(Math.abs(worstClearanceM(points) - 7.38)).toBeLessThan(0.1);
  });
});
