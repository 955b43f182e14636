import type { HistoryEntryDto } from '../../shared/schemas/account';
import type { ChangeHistoryRow } from '../services/changeHistory';
import { iso } from './common';

export const presentHistoryEntry = (r: ChangeHistoryRow): HistoryEntryDto => ({
  id: r.id,
  table: r.table,
  recordId: r.recordId,
  action: r.action,
  changedAt: iso(r.changedAt)!,
  changedBy: r.changedById ? { id: r.changedById, name: r.changedByName ?? `Person ${r.changedById}` } : null,
  reason: r.reason ?? null,
  before: r.before,
  after: r.after,
});
