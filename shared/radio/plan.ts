import type { ChannelWidthMHz } from '../enums';
import { PlanningError } from './errors';
import { freeSpacePathLossDb } from './pathLoss';
import { clearanceNeededM, midPathEarthBulgeM, midPathFresnelRadiusM } from './fresnel';
import { antennaTiltDeg, geodesicInverse, normaliseBearingDeg, type MastPoint } from './geodesy';
import { DEFAULT_NOISE_FIGURE_DB, eirpDbm, expectedRateMbps, fadeMarginDb, noiseFloorDbm, rxSignalDbm } from './linkBudget';

export interface LinkBudgetInput {
  a?: MastPoint;
  b?: MastPoint;
  distanceKm?: number;
  freqMHz: number;
  channelWidthMHz: ChannelWidthMHz;
  txPowerDbm: number;
  txAntennaGainDbi: number;
  txCableLossDb: number;
  rxAntennaGainDbi: number;
  rxCableLossDb: number;
  noiseFigureDb?: number;
}

export interface LinkBudgetAnswer {
  distanceKm: number;
  azimuthDeg: number | null;
  reverseAzimuthDeg: number | null;
  tiltDeg: number | null;
  fsplDb: number;
  eirpDbm: number;
  rxSignalDbm: number;
  noiseFloorDbm: number;
  snrDb: number;
  expectedRateMbps: number;
  fadeMarginDb: number;
  fresnelRadiusM: number;
  earthBulgeM: number;
  clearanceNeededM: number;
}

/** Shortest path the budget is computed for; closer than this the far-field formulas mean nothing. */
export const MIN_LINK_DISTANCE_KM = 0.001;

const round = (x: number, places: number) => Math.round(x * 10 ** places) / 10 ** places;

function geometry(input: LinkBudgetInput) {
  if (input.a && input.b && input.distanceKm === undefined) {
    const g = geodesicInverse(input.a, input.b);
    if (!(g.distanceKm >= MIN_LINK_DISTANCE_KM)) {
      throw new PlanningError(400, 'sites_too_close', 'Sites a and b are less than 1 m apart; pick two different sites.');
    }
    return { ...g, tiltDeg: antennaTiltDeg(input.a, input.b, g.distanceKm) };
  }
  if (input.distanceKm !== undefined && !(input.a || input.b)) {
    if (!(input.distanceKm >= MIN_LINK_DISTANCE_KM)) {
      throw new PlanningError(400, 'distance_too_short', 'distanceKm must be at least 0.001 km (1 m).');
    }
    return { distanceKm: input.distanceKm, azimuthDeg: null, reverseAzimuthDeg: null, tiltDeg: null };
  }
  throw new PlanningError(400, 'link_geometry_required', 'Give either both sites a and b, or distanceKm, not both.');
}

/** The link-budget planning answer (API.md): geometry, budget, rate, margin and path clearance. */
export function computeLinkBudget(input: LinkBudgetInput): LinkBudgetAnswer {
  const g = geometry(input);
  const fsplDb = round(freeSpacePathLossDb(input.freqMHz, g.distanceKm), 2);
  const rx = round(rxSignalDbm({ ...input, pathLossDb: fsplDb }), 2);
  const noise = round(noiseFloorDbm(input.channelWidthMHz, input.noiseFigureDb ?? DEFAULT_NOISE_FIGURE_DB), 2);
  const fresnel = midPathFresnelRadiusM(input.freqMHz, g.distanceKm);
  const bulge = midPathEarthBulgeM(g.distanceKm);
  return {
    distanceKm: round(g.distanceKm, 4),
    azimuthDeg: g.azimuthDeg === null ? null : normaliseBearingDeg(round(g.azimuthDeg, 2)),
    reverseAzimuthDeg: g.reverseAzimuthDeg === null ? null : normaliseBearingDeg(round(g.reverseAzimuthDeg, 2)),
    tiltDeg: g.tiltDeg === null ? null : round(g.tiltDeg, 3),
    fsplDb,
    eirpDbm: round(eirpDbm(input.txPowerDbm, input.txAntennaGainDbi, input.txCableLossDb), 2),
    rxSignalDbm: rx,
    noiseFloorDbm: noise,
    snrDb: round(rx - noise, 2),
    // Derived from the rounded signal so the answer is self-consistent at table boundaries.
    expectedRateMbps: round(expectedRateMbps(rx, input.channelWidthMHz), 2),
    fadeMarginDb: round(fadeMarginDb(rx, input.channelWidthMHz), 2),
    fresnelRadiusM: round(fresnel, 2),
    earthBulgeM: round(bulge, 2),
    clearanceNeededM: round(clearanceNeededM(fresnel, bulge), 2),
  };
}
