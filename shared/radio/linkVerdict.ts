/**
 * Fade-margin bands for a planned link. A margin of 10 dB or more is the usual target for a fixed outdoor
 * Wi-Fi link (common practice, no source); 0–10 dB may close but fades with rain, foliage and misalignment.
 */
export const FADE_MARGIN_TARGET_DB = 10;
export type LinkVerdict = 'closes' | 'marginal' | 'will-not-close';

export function linkVerdict(fadeMarginDb: number): LinkVerdict {
  if (fadeMarginDb >= FADE_MARGIN_TARGET_DB) return 'closes';
  if (fadeMarginDb >= 0) return 'marginal';
  return 'will-not-close';
}

/**
 * A live link is flagged when its measured signal sits well below both its prediction and its own recent
 * baseline: the pair of conditions separates a link that was always weak from one that changed (an antenna
 * knocked off aim, water in a connector). Thresholds are common practice, no source.
 */
export const BELOW_PREDICTION_DB = 10;
export const BELOW_BASELINE_DB = 6;

export interface LinkHealthInput {
  measuredSignalDbm: number | null;
  predictedSignalDbm: number | null;
  baselineSignalDbm: number | null;
}
export interface LinkHealth {
  belowPredictionDb: number | null;
  belowBaselineDb: number | null;
  flagged: boolean;
}

const round2 = (x: number) => Math.round(x * 100) / 100;

export function assessLinkHealth(i: LinkHealthInput): LinkHealth {
  const belowPredictionDb = i.measuredSignalDbm === null || i.predictedSignalDbm === null ? null : round2(i.predictedSignalDbm - i.measuredSignalDbm);
  const belowBaselineDb = i.measuredSignalDbm === null || i.baselineSignalDbm === null ? null : round2(i.baselineSignalDbm - i.measuredSignalDbm);
  const flagged = belowPredictionDb !== null && belowBaselineDb !== null && belowPredictionDb > BELOW_PREDICTION_DB && belowBaselineDb > BELOW_BASELINE_DB;
  return { belowPredictionDb, belowBaselineDb, flagged };
}
