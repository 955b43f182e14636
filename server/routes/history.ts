import { Router } from 'express';
import { QueryTypes, type Sequelize } from 'sequelize';
import { historyQuerySchema, type HistoryEntryDto } from '../../shared/schemas/account';
import { NotFound } from '../errors';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { authorize } from '../policies/authorize';
import { assertHistoryReadable, mayReadWholeHistory } from '../policies/history';

interface Row extends Omit<HistoryEntryDto, 'changedBy' | 'changedAt'> {
  changedAt: Date;
  changedById: number | null;
  changedByName: string | null;
  total: string;
}

/** The audit trail: one record's changes for whoever may read the record, everything for admins. */
export function historyRoutes(sequelize: Sequelize) {
  const router = Router();

  router.get('/', validate('query', historyQuerySchema), async (req, res) => {
    const actor = actorOf(req);
    const { table, recordId, page, pageSize } = res.locals.query;
    if (!table || !recordId) {
      authorize(mayReadWholeHistory(actor), 'Only admins read the whole change history. Give table and recordId for one record’s history.');
    } else if (!(await assertHistoryReadable(actor, table, recordId))) {
      throw NotFound(`The ${table} record ${recordId}`);
    }
    const rows = await sequelize.query<Row>(
      `SELECT h.id::int AS id, h.table_name AS "table", h.record_id AS "recordId", h.action, h.changed_at AS "changedAt",
              h.changed_by AS "changedById", u.name AS "changedByName", h.reason, h.before, h.after, count(*) OVER () AS total
         FROM change_history h LEFT JOIN users u ON u.id = h.changed_by
        WHERE h.table_name = ANY($1::text[]) AND ($2::text IS NULL OR h.table_name = $2) AND ($3::text IS NULL OR h.record_id = $3)
        ORDER BY h.changed_at DESC, h.id DESC LIMIT $4 OFFSET $5`,
      {
        bind: [['sites', 'nodes', 'radios', 'links', 'neighbourhoods', 'users', 'network_settings', 'node_address_plans'], table ?? null, recordId ? String(recordId) : null, pageSize, (page - 1) * pageSize],
        type: QueryTypes.SELECT,
      },
    );
    const data: HistoryEntryDto[] = rows.map((r) => ({
      id: r.id, table: r.table, recordId: r.recordId, action: r.action, changedAt: new Date(r.changedAt).toISOString(),
      changedBy: r.changedById ? { id: r.changedById, name: r.changedByName ?? `Person ${r.changedById}` } : null,
      reason: r.reason ?? null, before: r.before, after: r.after,
    }));
    res.json({ data, pagination: { page, pageSize, total: Number(rows[0]?.total ?? 0) } });
  });

  return router;
}
