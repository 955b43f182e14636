/**
 * Parapet's fade-margin bands, one scale for the planning page and the map (common practice, no source): about 20 dB
 * rides out most fading on a rooftop link; 10 dB is the usual minimum target for a fixed outdoor link; under 10 dB
 * it drops in rain or when a tree grows into the path; below 0 dB even the slowest rate cannot be received.
 */
export const FADE_MARGIN_TARGET_DB = 10;
export const FADE_MARGIN_COMFORTABLE_DB = 20;
export type MarginBand = 'comfortable' | 'thin' | 'at-risk' | 'unknown';
export type LinkVerdict = Exclude<MarginBand, 'unknown'>;

export const MARGIN_BANDS: { band: MarginBand; label: string; range: string }[] = [
  { band: 'comfortable', label: 'Comfortable', range: `${FADE_MARGIN_COMFORTABLE_DB} dB or more` },
  { band: 'thin', label: 'Thin', range: `${FADE_MARGIN_TARGET_DB} to ${FADE_MARGIN_COMFORTABLE_DB} dB` },
  { band: 'at-risk', label: 'At risk', range: `under ${FADE_MARGIN_TARGET_DB} dB` },
  { band: 'unknown', label: 'Unknown', range: 'radio settings missing' },
];

export function marginBand(fadeMarginDb: number | null): MarginBand {
  if (fadeMarginDb === null || !Number.isFinite(fadeMarginDb)) return 'unknown';
  if (fadeMarginDb >= FADE_MARGIN_COMFORTABLE_DB) return 'comfortable';
  if (fadeMarginDb >= FADE_MARGIN_TARGET_DB) return 'thin';
  return 'at-risk';
}

/** The planning verdict: the map's band for the same margin. */
export function linkVerdict(fadeMarginDb: number): LinkVerdict {
  return marginBand(fadeMarginDb) as LinkVerdict;
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
