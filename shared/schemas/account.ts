import { z } from 'zod';
import { type NodeState, ROLES } from '../enums';
import { newPasswordSchema } from '../security/passwordRules';
import { lineSchema, listQuerySchema, nameSchema } from './common';
import type { MaintenanceWindowsBody } from './alerts';
import { AUDITED_TABLE_NAMES } from './auditTables';

const emailSchema = z.string({ error: 'is required' }).trim().toLowerCase().email('must be an e-mail address').max(254, 'must be at most 254 characters');
const tokenSchema = z.string({ error: 'is required' }).min(1, 'is required').max(200, 'is too long');
const phoneSchema = lineSchema(40).nullable();

export const invitationCreateSchema = z.object({
  email: emailSchema,
  name: nameSchema,
  role: z.enum(ROLES, { error: `must be one of ${ROLES.join(', ')}` }),
  /** Operators invite hosts only, for a site of theirs: the invited person becomes its host. */
  siteId: z.coerce.number({ error: 'must be a number' }).int('must be a whole number').positive('must be a positive id').optional(),
});
export const invitationAcceptSchema = z.object({ token: tokenSchema, password: newPasswordSchema });
export const passwordResetRequestSchema = z.object({ email: emailSchema });
export const passwordResetCompleteSchema = z.object({ token: tokenSchema, password: newPasswordSchema });
export const passwordChangeSchema = z.object({
  currentPassword: z.string({ error: 'is required' }).min(1, 'is required').max(1024, 'is too long'),
  newPassword: newPasswordSchema,
});
export const meUpdateSchema = z
  .object({ name: nameSchema.optional(), phone: phoneSchema.optional() })
  .refine((v) => v.name !== undefined || v.phone !== undefined, { message: 'give a name or a phone number to change' });

export { AUDITED_TABLE_NAMES };
export const historyQuerySchema = listQuerySchema.pick({ page: true, pageSize: true }).extend({
  table: z.enum(AUDITED_TABLE_NAMES, { error: `must be one of ${AUDITED_TABLE_NAMES.join(', ')}` }).optional(),
  recordId: z.coerce.number({ error: 'must be a number' }).int('must be a whole number').positive('must be a positive id').optional(),
});

export type InvitationCreate = z.infer<typeof invitationCreateSchema>;

export interface MeDto {
  id: number;
  email: string;
  name: string;
  role: (typeof ROLES)[number];
  phone: string | null;
}

export interface HistoryEntryDto {
  id: number;
  table: string;
  recordId: string;
  action: 'create' | 'update' | 'delete';
  changedAt: string;
  changedBy: { id: number; name: string } | null;
  reason: string | null;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
}

export interface HostedNodeDto {
  id: number;
  name: string;
  state: NodeState;
  stateSince: string | null;
  lastSeenAt: string | null;
  summary: string;
  availability: { h24Pct: number | null; d30Pct: number | null };
  recentOutages: { id: number; startedAt: string; endedAt: string | null; acknowledged: boolean }[];
  /** What GET /nodes/:id/maintenance-windows answers for this node, so the page draws it without asking again. */
  maintenance: MaintenanceWindowsBody;
}
export interface HostedSiteDto {
  id: number;
  name: string;
  neighbourhoodName: string;
  nodes: HostedNodeDto[];
}
