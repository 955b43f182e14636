// How a link is drawn: width by the rate it should carry, colour by its fade margin.

export type MarginBand = 'comfortable' | 'thin' | 'at-risk' | 'unknown';

/**
 * Parapet's own bands for a link's predicted fade margin (common practice, no source: about
 * 20 dB rides out most fading on a short rooftop link; under 10 dB the link drops in rain or
 * when a tree grows into the path).
 */
export const MARGIN_BANDS: { band: MarginBand; label: string; range: string }[] = [
  { band: 'comfortable', label: 'Comfortable', range: '20 dB or more' },
  { band: 'thin', label: 'Thin', range: '10 to 20 dB' },
  { band: 'at-risk', label: 'At risk', range: 'under 10 dB' },
  { band: 'unknown', label: 'Unknown', range: 'radio settings missing' },
];

export function marginBand(fadeMarginDb: number | null): MarginBand {
  if (fadeMarginDb === null || !Number.isFinite(fadeMarginDb)) return 'unknown';
  if (fadeMarginDb >= 20) return 'comfortable';
  if (fadeMarginDb >= 10) return 'thin';
  return 'at-risk';
}

/** CSS colour of a band; the variables are set per theme in styles.css. */
export function marginColour(band: MarginBand): string {
  return `var(--pp-link-${band})`;
}

const WIDEST_RATE_MBPS = 300;

/** 1.5 px for a link with no expected rate up to 6 px at 300 Mbps and above (square root, so slow links stay visible). */
export function linkWidthPx(expectedRateMbps: number | null): number {
  if (expectedRateMbps === null || !Number.isFinite(expectedRateMbps) || expectedRateMbps <= 0) return 1.5;
  return 1.5 + 4.5 * Math.sqrt(Math.min(expectedRateMbps, WIDEST_RATE_MBPS) / WIDEST_RATE_MBPS);
}

/** The dash pattern of a link that is only planned, scaled with its width. */
export function plannedDash(widthPx: number): string {
  return `${(widthPx * 3).toFixed(1)} ${(widthPx * 2.5).toFixed(1)}`;
}
