import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';

export interface ChangeRecord {
  tableName: string;
  recordId: string | number;
  action: 'create' | 'update' | 'delete';
  changedBy: number | null;
  reason?: string;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
}

// Entries the model hooks (services/audit.ts) wrote in each open transaction, so a route that also
// records the same change by hand (with a reason) replaces the hook's entry instead of doubling it.
const hookEntries = new WeakMap<Transaction, Map<string, number>>();
const keyOf = (c: Pick<ChangeRecord, 'tableName' | 'recordId' | 'action'>) => `${c.tableName}|${c.recordId}|${c.action}`;

export function rememberHookEntry(transaction: Transaction, change: ChangeRecord, id: number) {
  const entries = hookEntries.get(transaction) ?? new Map<string, number>();
  entries.set(keyOf(change), id);
  hookEntries.set(transaction, entries);
}

/** Writes changes inside the caller's transaction, so a change and its record stand or fall together. Answers the new ids. */
export async function recordChanges(sequelize: Sequelize, changes: ChangeRecord[], transaction?: Transaction): Promise<number[]> {
  if (changes.length === 0) return [];
  const known = transaction ? hookEntries.get(transaction) : undefined;
  const fresh: ChangeRecord[] = [];
  for (const c of changes) {
    const existing = known?.get(keyOf(c));
    if (existing === undefined) {
      fresh.push(c);
      continue;
    }
    known!.delete(keyOf(c));
    await sequelize.query(`UPDATE change_history SET changed_by = $2, reason = $3, before = $4::jsonb, after = $5::jsonb WHERE id = $1`, {
      bind: [existing, c.changedBy, c.reason ?? null, c.before === null ? null : JSON.stringify(c.before), c.after === null ? null : JSON.stringify(c.after)],
      transaction,
    });
  }
  if (fresh.length === 0) return [];
  const rows = await sequelize.query<{ id: string }>(
    `INSERT INTO change_history (table_name, record_id, action, changed_by, reason, before, after)
     SELECT x.table_name, x.record_id, x.action, x.changed_by, x.reason, x.before, x.after
       FROM jsonb_to_recordset($1::jsonb) AS x(table_name text, record_id text, action text, changed_by int, reason text, before jsonb, after jsonb)
     RETURNING id`,
    {
      bind: [JSON.stringify(fresh.map((c) => ({
        table_name: c.tableName, record_id: String(c.recordId), action: c.action, changed_by: c.changedBy,
        reason: c.reason ?? null, before: c.before, after: c.after,
      })))],
      type: QueryTypes.SELECT,
      transaction,
    },
  );
  return rows.map((r) => Number(r.id));
}
