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
      bind: [
        JSON.stringify(
          fresh.map((c) => ({
            table_name: c.tableName,
            record_id: String(c.recordId),
            action: c.action,
            changed_by: c.changedBy,
            reason: c.reason ?? null,
            before: c.before,
            after: c.after,
          })),
        ),
      ],
      type: QueryTypes.SELECT,
      transaction,
    },
  );
  return rows.map((r) => Number(r.id));
}

/** The tables whose changes the history page may show. */
const AUDITED_TABLES = ['sites', 'nodes', 'radios', 'links', 'neighbourhoods', 'users', 'network_settings', 'node_address_plans'];

export interface ChangeHistoryRow {
  id: number;
  table: string;
  recordId: string;
  action: ChangeRecord['action'];
  changedAt: Date;
  changedById: number | null;
  changedByName: string | null;
  reason: string | null;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
  total: string;
}

/** One page of the trail, newest first, optionally of one table or one record; the caller has checked who may read it. */
export async function listChangeHistory(sequelize: Sequelize, q: { table?: string; recordId?: number; page: number; pageSize: number }) {
  const rows = await sequelize.query<ChangeHistoryRow>(
    `SELECT h.id::int AS id, h.table_name AS "table", h.record_id AS "recordId", h.action, h.changed_at AS "changedAt",
            h.changed_by AS "changedById", u.name AS "changedByName", h.reason, h.before, h.after, count(*) OVER () AS total
       FROM change_history h LEFT JOIN users u ON u.id = h.changed_by
      WHERE h.table_name = ANY($1::text[]) AND ($2::text IS NULL OR h.table_name = $2) AND ($3::text IS NULL OR h.record_id = $3)
      ORDER BY h.changed_at DESC, h.id DESC LIMIT $4 OFFSET $5`,
    {
      bind: [AUDITED_TABLES, q.table ?? null, q.recordId ? String(q.recordId) : null, q.pageSize, (q.page - 1) * q.pageSize],
      type: QueryTypes.SELECT,
    },
  );
  return { rows, total: Number(rows[0]?.total ?? 0) };
}
