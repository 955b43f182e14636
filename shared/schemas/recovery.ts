import { z } from 'zod';
import type { NodeState } from '../enums';
import { hostStepSchema, type TimelineEntryDto } from './outage';

/** A step from the recovery page: the signed link from the mail is the permission. */
export const recoveryStepSchema = hostStepSchema.extend({
  t: z
    .string({ error: 'is required: open the page from the link in your e-mail' })
    .min(1, 'is required: open the page from the link in your e-mail')
    .max(200, 'is not a Parapet link'),
});

/** What the host's phone page shows: their node, whether the cause is elsewhere, what they did, what happens next. */
export interface RecoveryDto {
  outageId: number;
  node: { id: number; name: string; state: NodeState; lastSeenAt: string | null };
  siteName: string;
  neighbourhoodName: string;
  startedAt: string;
  endedAt: string | null;
  /** Set when the cause lies further up the network: nothing to do at the host's place. */
  upstream: { nodeName: string; siteName: string } | null;
  steps: TimelineEntryDto[];
  /** Who follows up if nothing helped, and when, in plain words. */
  whatNext: string;
  operators: { name: string }[];
  acknowledgedBy: string | null;
  linkExpiresAt: string;
}
