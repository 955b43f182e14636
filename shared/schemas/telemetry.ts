import { z } from 'zod';
import { SERIES_RANGES, type SeriesRange } from '../enums';

export { SERIES_RANGES, type SeriesRange };
export const seriesQuerySchema = z.object({ range: z.enum(SERIES_RANGES, { error: 'must be 24h, 7d or 30d' }).default('24h') });

/** One roll-up bucket; a figure is null when no report in the bucket carried it. */
export interface SeriesPointDto {
  t: string;
  availabilityPct: number | null;
  signalAvgDbm: number | null;
  signalMinDbm: number | null;
  noiseAvgDbm: number | null;
  snrAvgDb: number | null;
  throughputAvgMbps: number | null;
  latencyAvgMs: number | null;
}

/** GET /nodes/:id/series. */
export interface NodeSeriesDto {
  range: SeriesRange;
  bucketS: number;
  points: SeriesPointDto[];
}

/** GET /nodes/:id/availability: percent of each window the node was up, or null if it was never seen in it. */
export interface NodeAvailabilityDto {
  h24: number | null;
  d7: number | null;
  d30: number | null;
  d90: number | null;
}
