import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { z } from 'zod';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { EXPORT_KINDS, exportCsv, type ExportKind } from '../services/csvExport';

const fileParamsSchema = z.object({
  file: z.enum(EXPORT_KINDS.map((k) => `${k}.csv`) as [string, ...string[]], { error: `must be one of ${EXPORT_KINDS.map((k) => `${k}.csv`).join(', ')}` }),
});

/** Mounted at /exports: GET /exports/sites.csv and friends, for whatever the caller may read. */
export function exportRoutes(sequelize: Sequelize) {
  const router = Router();

  router.get('/:file', validate('params', fileParamsSchema), async (req, res) => {
    const kind = (res.locals.params.file as string).replace(/\.csv$/, '') as ExportKind;
    const csv = await exportCsv(sequelize, kind, actorOf(req));
    const day = new Date().toISOString().slice(0, 10);
    res.set({
      'Content-Type': 'text/csv; charset=utf-8',
      'Content-Disposition': `attachment; filename="parapet-${kind}-${day}.csv"`,
      'Cache-Control': 'no-store',
    });
    res.send(`\uFEFF${csv}\r\n`);
  });

  return router;
}
