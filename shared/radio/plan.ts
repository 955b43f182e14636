import type { ChannelWidthMHz } from '../enums';
import { PlanningError } from './errors';
import { freeSpacePathLossDb } from './pathLoss';
import { clearanceNeededM, EFFECTIVE_EARTH_K, midPathEarthBulgeM, midPathFresnelRadiusM } from './fresnel';
import { antennaTiltDeg, geodesicInverse, normaliseBearingDeg, type MastPoint } from './geodesy';
import { DEFAULT_NOISE_FIGURE_DB, eirpDbm, noiseFloorDbm, rxSignalDbm } from './linkBudget';
import {
  ackDistanceSettingKm,
  ACK_DISTANCE_WARNING_KM,
  lineOfSight,
  radioHorizonKm,
  roundTripUs,
  worstKnifeEdge,
  WORST_CASE_K,
  type GroundPoint,
  type LineOfSight,
  type Obstacle,
  type PathInput,
} from './lineOfSight';
import { bestRate, marginForTargetDb, rateTable, type GuardInterval, type RateRow, type SpatialStreams } from './rates';
import { computeRegulatory } from './regulatory';
import { isPlanningError } from './errors';
import { FADE_MARGIN_TARGET_DB } from './linkVerdict';

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
  streams?: SpatialStreams;
  guardInterval?: GuardInterval;
  kFactor?: number;
  obstacles?: Obstacle[];
  region?: 'US' | 'EU';
  /** The rate the link must carry; the answer gives the margin against it. */
  targetRateMbps?: number;
  /** Ground under the path from elevation tiles (the server fills it when the body asks for terrain). */
  terrainProfile?: GroundPoint[];
}

export interface WidthOption {
  channelWidthMHz: ChannelWidthMHz;
  noiseFloorDbm: number;
  expectedRateMbps: number;
  mcs: number | null;
  fadeMarginDb: number;
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
  // Second edition (API.md "Planning, second edition").
  lineOfSight: LineOfSight | null;
  /** The same check at the worst-case k = 2/3 (ITU-R P.530 practice). */
  lineOfSightWorstCase: (LineOfSight & { kFactor: number }) | null;
  radioHorizonKm: number | null;
  diffractionLossDb: number;
  roundTripUs: number;
  /** Distance setting (ACK timeout) to enter on the radios. */
  ackDistanceKm: number;
  warnings: string[];
  kFactor: number;
  streams: SpatialStreams;
  guardInterval: GuardInterval;
  mcs: number | null;
  rates: (RateRow & { marginDb: number })[];
  targetRateMbps: number | null;
  targetMarginDb: number | null;
  widthOptions: WidthOption[];
  terrainUsed: boolean;
  profile?: GroundPoint[];
}

/** Shortest path the budget is computed for; closer than this the far-field formulas mean nothing. */
export const MIN_LINK_DISTANCE_KM = 0.001;
/** Longest path planned here; beyond it the flat-path model of this page means nothing. */
export const MAX_LINK_DISTANCE_KM = 500;

const round = (x: number, places: number) => Math.round(x * 10 ** places) / 10 ** places;
/** A bearing rounded to 0.01° and kept in [0, 360): round first, then normalise, so 51.2 stays 51.2 and 359.999 is 0. */
const bearing = (deg: number) => round(normaliseBearingDeg(round(deg, 2)), 2) % 360;

function geometry(input: LinkBudgetInput) {
  if (input.a && input.b && input.distanceKm === undefined) {
    const g = geodesicInverse(input.a, input.b);
    if (!(g.distanceKm >= MIN_LINK_DISTANCE_KM)) {
      throw new PlanningError(400, 'sites_too_close', 'Sites a and b are less than 1 m apart; pick two different sites.');
    }
    if (g.distanceKm > MAX_LINK_DISTANCE_KM) {
      throw new PlanningError(
        400,
        'sites_too_far',
        `Sites a and b are ${Math.round(g.distanceKm).toLocaleString('en')} km apart; links are planned up to ${MAX_LINK_DISTANCE_KM} km. Check the coordinates (a sign or a swapped latitude and longitude?).`,
      );
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

function checkObstacles(obstacles: Obstacle[], distanceKm: number) {
  obstacles.forEach((o, i) => {
    if (!(o.distanceKm > 0 && o.distanceKm < distanceKm)) {
      throw new PlanningError(
        400,
        'obstacle_off_path',
        `obstacles.${i}.distanceKm ${o.distanceKm} km is not between the two ends (0–${round(distanceKm, 3)} km); give its distance from end a.`,
      );
    }
  });
}

const fmt1 = (x: number) => x.toFixed(1);

function losWarning(los: LineOfSight, k: string): string {
  const what = los.blockedBy === 'obstacle' ? 'the obstacle' : 'the ground (with the earth bulge)';
  if (los.worstClearanceM < 0) {
    return `Line of sight blocked at k = ${k}: ${fmt1(los.atDistanceKm)} km from a the line between the antennas runs ${fmt1(-los.worstClearanceM)} m below ${what}; it needs ${fmt1(los.requiredClearanceM)} m above it. Raise the antennas or choose another path.`;
  }
  return `Fresnel zone not clear at k = ${k}: ${fmt1(los.atDistanceKm)} km from a the line clears ${what} by ${fmt1(los.worstClearanceM)} m of the ${fmt1(los.requiredClearanceM)} m needed (60 % of the first Fresnel zone).`;
}

/** The link-budget planning answer (API.md): geometry, budget, rates, margin, clearance and warnings. */
export function computeLinkBudget(input: LinkBudgetInput): LinkBudgetAnswer {
  if (input.freqMHz < 3000 && input.channelWidthMHz === 80) {
    // Stored radios saved before the channel rule can still carry this; no rate table exists for it (VHT is 5 GHz only).
    throw new PlanningError(400, 'no_80mhz_on_24ghz', 'channelWidthMHz must be 20 or 40 on 2.4 GHz: the band has no 80 MHz channel.');
  }
  const g = geometry(input);
  const D = g.distanceKm;
  const k = input.kFactor ?? EFFECTIVE_EARTH_K;
  const streams = input.streams ?? 1;
  const guardInterval = input.guardInterval ?? 'long';
  const noiseFigure = input.noiseFigureDb ?? DEFAULT_NOISE_FIGURE_DB;
  const obstacles = input.obstacles ?? [];
  checkObstacles(obstacles, D);
  const warnings: string[] = [];

  let path: PathInput | null = null;
  if (input.a && input.b) {
    path = {
      distanceKm: D,
      freqMHz: input.freqMHz,
      kFactor: k,
      obstacles,
      terrain: input.terrainProfile,
      aGroundM: input.a.groundElevationM ?? 0,
      aHeightM: input.a.heightM,
      bGroundM: input.b.groundElevationM ?? 0,
      bHeightM: input.b.heightM,
    };
  } else if (obstacles.length > 0) {
    warnings.push('Obstacles need both sites (a and b with heights) to be placed against the line of sight; they were not counted.');
  }
  const los = path ? lineOfSight(path) : null;
  const losWorst = path ? { ...lineOfSight(path, WORST_CASE_K), kFactor: round(WORST_CASE_K, 4) } : null;
  const knife = path ? worstKnifeEdge(path) : { lossDb: 0, nu: null, obstacle: null };
  const diffractionLossDb = round(knife.lossDb, 2);

  const fsplDb = round(freeSpacePathLossDb(input.freqMHz, D), 2);
  const rx = round(rxSignalDbm({ ...input, pathLossDb: fsplDb + diffractionLossDb }), 2);
  const noise = round(noiseFloorDbm(input.channelWidthMHz, noiseFigure), 2);
  const table = rateTable(input.channelWidthMHz, streams, guardInterval, noiseFigure);
  const best = bestRate(rx, table);
  const fadeMarginDb = round(rx - table[0].sensitivityDbm, 2);
  const target = input.targetRateMbps !== undefined ? marginForTargetDb(rx, table, input.targetRateMbps) : null;
  const fresnel = midPathFresnelRadiusM(input.freqMHz, D);
  const bulge = midPathEarthBulgeM(D, k);
  const horizon = input.a && input.b ? radioHorizonKm(input.a.heightM, input.b.heightM) : null;
  const is24 = input.freqMHz < 3000;

  const kText = Math.abs(k - 4 / 3) < 0.001 ? '4/3' : Math.abs(k - 2 / 3) < 0.001 ? '2/3' : String(round(k, 3));
  if (los && !los.clear) warnings.push(losWarning(los, kText));
  if (los?.clear && losWorst && !losWorst.clear)
    warnings.push(`${losWarning(losWorst, '2/3')} Clear at k = 4/3 but not in worst-case refraction (ITU-R P.530): expect fades on some days.`);
  if (horizon !== null && D > horizon && !input.terrainProfile)
    warnings.push(`The path (${fmt1(D)} km) is longer than the radio horizon for these antenna heights (${fmt1(horizon)} km): raise the antennas.`);
  if (diffractionLossDb > 0 && knife.obstacle)
    warnings.push(
      `The obstacle ${knife.obstacle.distanceKm} km from a costs ${fmt1(diffractionLossDb)} dB of knife-edge diffraction loss (ITU-R P.526); it is included in the received signal.`,
    );
  if (target === null && input.targetRateMbps !== undefined)
    warnings.push(
      `No rate at ${input.channelWidthMHz} MHz with ${streams} stream(s) reaches ${input.targetRateMbps} Mb/s; use more streams or a wider channel.`,
    );
  else if (target && target.marginDb < FADE_MARGIN_TARGET_DB)
    warnings.push(
      `Only ${fmt1(target.marginDb)} dB of margin at the target ${target.row.rateMbps} Mb/s (MCS${target.row.mcs}); ${FADE_MARGIN_TARGET_DB} dB or more is the usual aim (common practice).`,
    );
  if (streams === 2) warnings.push('Two spatial streams need two antenna chains (usually both polarisations) and a clean path on each.');
  if (D > ACK_DISTANCE_WARNING_KM)
    warnings.push(
      `Long link: the round trip is ${fmt1(roundTripUs(D))} µs; set the radios' distance (ACK timeout) setting to at least ${ackDistanceSettingKm(D)} km on both ends, or throughput drops sharply.`,
    );
  if (input.region) {
    try {
      const reg = computeRegulatory({
        region: input.region,
        freqMHz: input.freqMHz,
        channelWidthMHz: input.channelWidthMHz,
        antennaGainDbi: input.txAntennaGainDbi,
        txPowerDbm: input.txPowerDbm,
        cableLossDb: input.txCableLossDb,
        linkType: 'point-to-point',
        deployment: 'outdoor',
      });
      for (const p of reg.problems) warnings.push(`${input.region} rules: ${p}`);
      if (reg.dfs) warnings.push(reg.dfs.advice);
    } catch (e) {
      if (!isPlanningError(e)) throw e;
      warnings.push(`${input.region} rules: ${e.message}`);
    }
  }

  const widthOptions: WidthOption[] = ([20, 40, 80] as const)
    .filter((w) => !(is24 && w === 80))
    .map((w) => {
      const t = rateTable(w, streams, guardInterval, noiseFigure);
      const r = bestRate(rx, t);
      return {
        channelWidthMHz: w,
        noiseFloorDbm: round(noiseFloorDbm(w, noiseFigure), 2),
        expectedRateMbps: r?.rateMbps ?? 0,
        mcs: r?.mcs ?? null,
        fadeMarginDb: round(rx - t[0].sensitivityDbm, 2),
      };
    });

  const r2 = (l: LineOfSight) => ({
    ...l,
    worstClearanceM: round(l.worstClearanceM, 2),
    requiredClearanceM: round(l.requiredClearanceM, 2),
    atDistanceKm: round(l.atDistanceKm, 3),
  });
  return {
    distanceKm: round(D, 4),
    azimuthDeg: g.azimuthDeg === null ? null : bearing(g.azimuthDeg),
    reverseAzimuthDeg: g.reverseAzimuthDeg === null ? null : bearing(g.reverseAzimuthDeg),
    tiltDeg: g.tiltDeg === null ? null : round(g.tiltDeg, 3),
    fsplDb,
    eirpDbm: round(eirpDbm(input.txPowerDbm, input.txAntennaGainDbi, input.txCableLossDb), 2),
    rxSignalDbm: rx,
    noiseFloorDbm: noise,
    snrDb: round(rx - noise, 2),
    expectedRateMbps: best?.rateMbps ?? 0,
    fadeMarginDb,
    fresnelRadiusM: round(fresnel, 2),
    earthBulgeM: round(bulge, 2),
    clearanceNeededM: round(clearanceNeededM(fresnel, bulge), 2),
    lineOfSight: los ? r2(los) : null,
    lineOfSightWorstCase: losWorst ? { ...r2(losWorst), kFactor: losWorst.kFactor } : null,
    radioHorizonKm: horizon === null ? null : round(horizon, 2),
    diffractionLossDb,
    roundTripUs: round(roundTripUs(D), 3),
    ackDistanceKm: ackDistanceSettingKm(D),
    warnings,
    kFactor: round(k, 4),
    streams,
    guardInterval,
    mcs: best?.mcs ?? null,
    rates: table.map((row) => ({ ...row, marginDb: round(rx - row.sensitivityDbm, 2) })),
    targetRateMbps: input.targetRateMbps ?? null,
    targetMarginDb: target ? round(target.marginDb, 2) : null,
    widthOptions,
    terrainUsed: !!input.terrainProfile,
    ...(input.terrainProfile ? { profile: input.terrainProfile.map((p) => ({ distanceKm: round(p.distanceKm, 4), groundM: round(p.groundM, 1) })) } : {}),
  };
}
