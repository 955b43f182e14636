import { z } from 'zod';
import { HOST_STEPS } from '../health/hostSteps';
import { hasHiddenCharacters, idSchema, listQuerySchema } from './common';

export const outageListQuerySchema = listQuerySchema.extend({
  status: z.enum(['open', 'closed'], { error: 'must be open or closed' }).optional(),
  neighbourhoodId: idSchema.optional(),
  nodeId: idSchema.optional(),
});
export const outageNotesSchema = z.object({
  notes: z
    .string({ error: 'must be text' })
    .trim()
    .max(4000, 'must be at most 4000 characters')
    .refine((s) => !hasHiddenCharacters(s, true), 'must not contain control characters (other than line breaks) or text-direction characters'),
});

export const hostStepSchema = z.object({
  step: z.enum(HOST_STEPS, { error: `must be one of ${HOST_STEPS.join(', ')}` }),
  note: z
    .string({ error: 'must be text' })
    .trim()
    .max(500, 'must be at most 500 characters')
    .refine((s) => !hasHiddenCharacters(s, true), 'must not contain control characters (other than line breaks) or text-direction characters')
    .optional(),
});
export type HostStepInput = z.infer<typeof hostStepSchema>;

export const TIMELINE_KINDS = ['opened', 'acknowledged', 'note', 'host-step', 'closed'] as const;
export interface TimelineEntryDto {
  at: string;
  kind: (typeof TIMELINE_KINDS)[number];
  text: string;
  byUserId?: number | null;
  /** On a host step: which one. */
  step?: (typeof HOST_STEPS)[number];
}

/** The nodes cut off behind an outage's node (stranded by it), not counting the node itself. */
export interface BlastRadiusDto {
  nodeCount: number;
  neighbourhoodIds: number[];
  /** Clients on the cut-off nodes' access points at their last report. */
  clients: number;
  /** The cut-off nodes the caller may read (all of them for admins). */
  nodeIds: number[];
}

export interface OutageDto {
  id: number;
  nodeId: number;
  nodeName: string;
  neighbourhoodId: number;
  startedAt: string;
  endedAt: string | null;
  durationS: number;
  acknowledgedAt: string | null;
  acknowledgedBy: { id: number; name: string } | null;
  notes: string | null;
  blastRadius: BlastRadiusDto;
  abilities: { acknowledge: boolean; annotate: boolean; recordHostStep: boolean };
  /** Only on a single outage (GET /outages/:id): what happened, oldest first. */
  timeline?: TimelineEntryDto[];
}
