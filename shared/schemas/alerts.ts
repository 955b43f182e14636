import { z } from 'zod';
import { OUTBOX_KINDS, OUTBOX_STATUSES } from '../enums';
import { lineSchema, listQuerySchema } from './common';

export const OPERATOR_MAIL_MODES = ['immediate', 'hourly', 'off'] as const;
export type OperatorMailMode = (typeof OPERATOR_MAIL_MODES)[number];

export const outboxListQuerySchema = listQuerySchema.extend({
  status: z.enum(OUTBOX_STATUSES, { error: `must be one of ${OUTBOX_STATUSES.join(', ')}` }).optional(),
  kind: z.enum(OUTBOX_KINDS, { error: `must be one of ${OUTBOX_KINDS.join(', ')}` }).optional(),
});

const clockTime = z.string({ error: 'must be a time like 22:00' }).regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'must be a time like 22:00 (24-hour clock)');
const flag = z.boolean({ error: 'must be true or false' });

/** What a person may change about the mail they get; quiet hours are both set or both cleared. */
export const preferencesUpdateSchema = z
  .object({
    operatorMode: z.enum(OPERATOR_MAIL_MODES, { error: 'must be immediate, hourly or off' }).optional(),
    hostMail: flag.optional(),
    quietStart: clockTime.nullable().optional(),
    quietEnd: clockTime.nullable().optional(),
    adminNodeMail: flag.optional(),
    adminSelfCheck: flag.optional(),
    upstreamNotices: flag.optional(),
    degradedDigest: flag.optional(),
  })
  .strict()
  .refine((p) => (p.quietStart === undefined) === (p.quietEnd === undefined) && (p.quietStart === null) === (p.quietEnd === null), {
    message: 'quiet hours need both a start and an end (or both cleared)',
    path: ['quietEnd'],
  })
  .refine((p) => !p.quietStart || p.quietStart !== p.quietEnd, { message: 'quiet hours must end at a different time than they start', path: ['quietEnd'] });
export type PreferencesUpdate = z.infer<typeof preferencesUpdateSchema>;

export interface PreferencesDto {
  operatorMode: OperatorMailMode;
  hostMail: boolean;
  quietStart: string | null;
  quietEnd: string | null;
  adminNodeMail: boolean;
  adminSelfCheck: boolean;
  upstreamNotices: boolean;
  degradedDigest: boolean;
  unsubscribedAt: string | null;
  timeZone: string;
  /** Which groups of settings apply to this person (the page shows only those). */
  applies: { operator: boolean; host: boolean; admin: boolean };
}

const MAX_WINDOW_DAYS = 14;
const isoTime = z.iso.datetime({ offset: true, error: 'must be a date and time like 2026-06-01T09:00:00Z' });
export const maintenanceWindowCreateSchema = z
  .object({
    startsAt: isoTime,
    endsAt: isoTime,
    reason: lineSchema(500).optional(),
  })
  .strict()
  .refine((w) => new Date(w.endsAt) > new Date(w.startsAt), { message: 'endsAt must be after startsAt', path: ['endsAt'] })
  .refine((w) => new Date(w.endsAt).getTime() - new Date(w.startsAt).getTime() <= MAX_WINDOW_DAYS * 86_400_000, {
    message: `a maintenance window may last at most ${MAX_WINDOW_DAYS} days`,
    path: ['endsAt'],
  });
export type MaintenanceWindowCreate = z.infer<typeof maintenanceWindowCreateSchema>;

export interface MaintenanceWindowDto {
  id: number;
  nodeId: number;
  startsAt: string;
  endsAt: string;
  reason: string | null;
  createdBy: { id: number; name: string } | null;
  cancelledAt: string | null;
  status: 'upcoming' | 'active' | 'over' | 'cancelled';
  abilities: { cancel: boolean };
}

/** GET /nodes/:id/maintenance-windows: the node's windows, and whether the caller may announce one. */
export interface MaintenanceWindowsBody {
  data: MaintenanceWindowDto[];
  abilities: { create: boolean };
}

export interface OutboxMessageDto {
  id: number;
  kind: (typeof OUTBOX_KINDS)[number];
  recipient: { userId: number | null; name: string | null; address: string };
  subject: string;
  status: (typeof OUTBOX_STATUSES)[number];
  attempts: number;
  lastError: string | null;
  nodeId: number | null;
  outageId: number | null;
  createdAt: string;
  nextAttemptAt: string;
  sentAt: string | null;
  abilities: { retry: boolean };
}
