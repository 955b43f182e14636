import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { historyQuerySchema } from '../../shared/schemas/account';
import { NotFound } from '../errors';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { authorize } from '../policies/authorize';
import { assertHistoryReadable, mayReadWholeHistory } from '../policies/history';
import { presentHistoryEntry } from '../presenters/history';
import { listChangeHistory } from '../services/changeHistory';

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
    const { rows, total } = await listChangeHistory(sequelize, { table, recordId, page, pageSize });
    res.json({ data: rows.map(presentHistoryEntry), pagination: { page, pageSize, total } });
  });

  return router;
}
