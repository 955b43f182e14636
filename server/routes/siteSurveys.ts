import path from 'node:path';
import { Router, type NextFunction, type Request, type Response } from 'express';
import multer from 'multer';
import type { Sequelize } from 'sequelize';
import { parseSurveyCsv, SURVEY_MAX_BYTES } from '../../shared/radio/surveyCsv';
import { idParamsSchema } from '../../shared/schemas/common';
import { ApiError, Invalid } from '../errors';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { mayManage } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { mayPlan } from '../policies/planning';
import { presentSiteSurvey } from '../presenters/planning';
import { readableNode } from '../services/references';
import { saveSurvey, surveysOf } from '../services/siteSurveys';

const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: SURVEY_MAX_BYTES, files: 1, fields: 5, parts: 6 } });
const LAYOUT = 'a CSV with the header ssid,channel,channelWidthMHz,signalDbm (band optional)';

/** multer's refusals as API errors: too large is 413, anything else about the upload's shape is 400. */
function receiveFile(req: Request, res: Response, next: NextFunction) {
  upload.single('file')(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE')
        return next(new ApiError(413, 'too_large', `The survey is larger than ${SURVEY_MAX_BYTES / 1e6} MB; split it into smaller files.`));
      return next(Invalid(`Upload one survey file in the form field "file" (${err.message}).`));
    }
    next(Invalid('The upload could not be read; send it as multipart/form-data with the file in the field "file".'));
  });
}

/** Only the base name is kept, for display; it is never used as a path. */
export function safeFileName(name: string | undefined): string | null {
  if (!name) return null;
  const base = path.posix
    .basename(name.replace(/\\/g, '/'))
    .replace(/[^\w .()-]+/g, '_')
    .replace(/^\.+/, '')
    .slice(0, 200);
  return base === '' ? null : base;
}

function asCsvText(buffer: Buffer): string {
  // Binary files (spreadsheets, images) carry NUL bytes or invalid UTF-8; a CSV is text.
  if (buffer.includes(0)) throw Invalid(`The file is not text; export the survey as ${LAYOUT}.`);
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(buffer);
  } catch {
    throw Invalid(`The file is not UTF-8 text; export the survey as ${LAYOUT}.`);
  }
}

/** Site surveys (scans of nearby networks) per node, in Parapet's CSV layout (shared/radio/surveyCsv.ts). */
export function siteSurveyRoutes(sequelize: Sequelize) {
  const router = Router({ mergeParams: true });

  router.get('/', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const node = await readableNode(actor, res.locals.params.id);
    authorize(mayPlan(actor), 'Site surveys are for operators and admins.');
    res.json({ data: (await surveysOf(sequelize, node.id)).map(presentSiteSurvey) });
  });

  router.post(
    '/',
    validate('params', idParamsSchema),
    async (req, res, next) => {
      const actor = actorOf(req);
      const node = await readableNode(actor, res.locals.params.id);
      authorize(mayManage(actor, node.neighbourhoodId), 'Only admins and the operators of its neighbourhood upload surveys for this node.');
      res.locals.node = node;
      next();
    },
    receiveFile,
    async (req, res) => {
      const actor = actorOf(req);
      if (!req.file) throw Invalid(`Attach the survey file in the form field "file": ${LAYOUT}.`);
      const parsed = parseSurveyCsv(asCsvText(req.file.buffer));
      const rejectedRows = parsed.errors.map((e) => ({ line: e.line, message: e.message }));
      if (parsed.rows.length === 0) {
        const details = rejectedRows.map((e) => ({ path: `line.${e.line}`, message: `line ${e.line}: ${e.message}` }));
        const first = details[0]?.message ?? 'the file has a header but no rows';
        throw Invalid(`No row of the survey could be used (${first}). Fix the file and upload it again.`, details);
      }
      const saved = await saveSurvey(sequelize, {
        nodeId: res.locals.node.id,
        fileName: safeFileName(req.file.originalname),
        uploadedBy: actor.id,
        rows: parsed.rows,
      });
      res.status(201).json({ data: presentSiteSurvey(saved), rejectedRows });
    },
  );

  return router;
}
