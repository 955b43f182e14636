// How a link is drawn: width by the rate it should carry, colour by its fade margin.
import type { MarginBand } from '../../../../shared/radio/linkVerdict';

// One scale with the planning page: the bands live in shared/radio/linkVerdict.ts.
export { MARGIN_BANDS, marginBand, type MarginBand } from '../../../../shared/radio/linkVerdict';

/** The sign drawn in a small disc at a link's middle, so the band does not rest on colour alone. */
export const MARGIN_MARK: Record<MarginBand, string | null> = { comfortable: null, thin: '−', 'at-risk': '!', unknown: '?' };

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

/** Round dots, spaced wide: a pair heard on the air that the inventory does not list. */
export const DISCOVERED_DASH = '0.1 7';
export const DISCOVERED_COLOUR = 'var(--pp-ink)';
