import type { MaintenanceWindowDto, MaintenanceWindowsBody, OutboxMessageDto } from '../../shared/schemas/alerts';
import type { MaintenanceWindow, OutboxMessage } from '../models';
import { iso } from './common';

export function presentOutboxMessage(m: OutboxMessage): OutboxMessageDto {
  return {
    id: Number(m.id),
    kind: m.kind as OutboxMessageDto['kind'],
    recipient: { userId: m.recipientUserId, name: m.recipientName, address: m.recipientAddress },
    subject: m.subject,
    status: m.status,
    attempts: m.attempts,
    lastError: m.lastError ?? null,
    nodeId: m.nodeId,
    outageId: m.outageId,
    createdAt: iso(m.createdAt)!,
    nextAttemptAt: iso(m.nextAttemptAt)!,
    sentAt: iso(m.sentAt),
    abilities: { retry: m.status === 'failed' },
  };
}

export function presentMaintenanceWindow(w: MaintenanceWindow, now: Date, mayCancel: boolean): MaintenanceWindowDto {
  const status: MaintenanceWindowDto['status'] = w.cancelledAt ? 'cancelled' : w.endsAt <= now ? 'over' : w.startsAt <= now ? 'active' : 'upcoming';
  return {
    id: w.id,
    nodeId: w.nodeId,
    startsAt: iso(w.startsAt)!,
    endsAt: iso(w.endsAt)!,
    reason: w.reason ?? null,
    createdBy: w.creator ? { id: w.creator.id, name: w.creator.name } : null,
    cancelledAt: iso(w.cancelledAt),
    status,
    abilities: { cancel: mayCancel && (status === 'upcoming' || status === 'active') },
  };
}

/** A node's windows as GET /nodes/:id/maintenance-windows answers them; `may`: the caller may announce and cancel. */
export const presentMaintenanceWindows = (windows: MaintenanceWindow[], now: Date, may: boolean): MaintenanceWindowsBody => ({
  data: windows.map((w) => presentMaintenanceWindow(w, now, may)),
  abilities: { create: may },
});
