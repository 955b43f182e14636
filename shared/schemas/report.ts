import { z } from 'zod';

// Reports cover months Parapet can hold data for; a year like 0000 is a typing slip, not a request.
export const MONTH_MIN_YEAR = 2000;
export const MONTH_MAX_YEAR = 2999;

export const availabilityReportQuerySchema = z.object({
  month: z
    .string({ error: 'is required, like 2026-11' })
    .regex(/^\d{4}-(0[1-9]|1[0-2])$/, 'must be a month like 2026-11')
    .refine(
      (m) => Number(m.slice(0, 4)) >= MONTH_MIN_YEAR && Number(m.slice(0, 4)) <= MONTH_MAX_YEAR,
      `must be a month between ${MONTH_MIN_YEAR} and ${MONTH_MAX_YEAR}, like 2026-11`,
    ),
  format: z.enum(['json', 'csv'], { error: 'must be json or csv' }).default('json'),
  /** Which table the CSV holds: availability per neighbourhood and node, or the outages. */
  table: z.enum(['availability', 'outages'], { error: 'must be availability or outages' }).default('availability'),
});

export interface AvailabilityRow {
  availabilityPct: number | null;
  observedS: number;
  downS: number;
  outageCount: number;
}

export interface AvailabilityReportDto {
  month: string;
  timeZone: string;
  /** The month's first and (exclusive) last instant in UTC; the end is now for the running month. */
  from: string;
  to: string;
  overall: AvailabilityRow;
  neighbourhoods: (AvailabilityRow & { id: number; name: string })[];
  nodes: (AvailabilityRow & { id: number; name: string; neighbourhoodId: number; neighbourhood: string })[];
  outages: {
    id: number;
    nodeId: number;
    node: string;
    neighbourhood: string;
    startedAt: string;
    endedAt: string | null;
    acknowledgedAt: string | null;
    /** From the outage's start (common practice, no source). */
    timeToAcknowledgeS: number | null;
    timeToRecoverS: number | null;
    downInMonthS: number;
  }[];
  /** Pooled availability per local day, for the chart. */
  days: { date: string; availabilityPct: number | null }[];
}
