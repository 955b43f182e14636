import { z } from 'zod';
import { hasHiddenCharacters, idSchema, listQuerySchema } from './common';

export const outageListQuerySchema = listQuerySchema.extend({
  status: z.enum(['open', 'closed'], { error: 'must be open or closed' }).optional(),
  neighbourhoodId: idSchema.optional(),
  nodeId: idSchema.optional(),
});
export const outageNotesSchema = z.object({
  notes: z.string({ error: 'must be text' }).trim().max(4000, 'must be at most 4000 characters').refine((s) => !hasHiddenCharacters(s, true), 'must not contain control characters (other than line breaks) or text-direction characters'),
});

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
  abilities: { acknowledge: boolean; annotate: boolean };
}
