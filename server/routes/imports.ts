import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { z } from 'zod';
import { IMPORT_KINDS, importQuerySchema, type ImportKind } from '../../shared/schemas/csvImport';
import type { Config } from '../config';
import { requireRole } from '../middlewares/requireRole';
import { actorOf } from '../middlewares/requireUser';
import { requireFile, singleUpload } from '../middlewares/upload';
import { validate } from '../middlewares/validate';
import { operatesAny } from '../policies/actor';
import { checkImport, commitImport } from '../services/csvImport';

const kindParamsSchema = z.object({ kind: z.enum(IMPORT_KINDS, { error: `must be one of ${IMPORT_KINDS.join(', ')}` }) });

/** Mounted at /imports: CSV files of sites or nodes, previewed with ?dryRun=true, else committed whole. */
export function importRoutes(sequelize: Sequelize, settings: Config) {
  const router = Router();
  const upload = singleUpload('file', settings.csvImportMaxBytes, 'CSV file');

  // Checked before the address, the query and the upload are read: hosts add nothing to the inventory.
  const gate = requireRole(operatesAny, 'Only admins and operators import sites and nodes.');
  router.post('/:kind', gate, validate('params', kindParamsSchema), validate('query', importQuerySchema), upload, async (req, res) => {
    const actor = actorOf(req);
    const kind = res.locals.params.kind as ImportKind;
    const file = requireFile(req, 'file', 'CSV file');
    const checked = await checkImport(kind, file.buffer, actor, settings.csvImportMaxRows);
    if (res.locals.query.dryRun) {
      res.json({ data: checked.preview });
      return;
    }
    const ids = await commitImport(sequelize, kind, checked);
    res.status(201).json({ data: { kind, created: ids.length, ids } });
  });

  return router;
}
