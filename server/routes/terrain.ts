import { Router, type NextFunction, type Request, type Response } from 'express';
import multer from 'multer';
import type { Sequelize } from 'sequelize';
import { z } from 'zod';
import { parseHgt, parseTileName } from '../../shared/terrain/hgt';
import { ApiError, Invalid, NotFound } from '../errors';
import { requireRole } from '../middlewares/requireRole';
import { actorOf } from '../middlewares/requireUser';
import { validate } from '../middlewares/validate';
import { isAdmin } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { mayPlan } from '../policies/planning';
import { deleteTile, listTiles, saveTile } from '../services/terrain';

/** A 1″ tile is 25,934,402 bytes; a little room for multipart framing. */
const MAX_TILE_BYTES = 26_000_000;
const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: MAX_TILE_BYTES, files: 1, fields: 2, parts: 3 } });

function receiveTile(req: Request, res: Response, next: NextFunction) {
  upload.single('tile')(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE')
        return next(new ApiError(413, 'too_large', 'The tile is larger than a 1″ SRTM tile (25,934,402 bytes); upload one unzipped .hgt file.'));
      return next(Invalid(`Upload one elevation tile in the form field "tile" (${err.message}).`));
    }
    next(Invalid('The upload could not be read; send it as multipart/form-data with the .hgt file in the field "tile".'));
  });
}

const tileParamsSchema = z.object({ name: z.string().regex(/^[NSns]\d{2}[EWew]\d{3}$/, 'name must be a tile name like N47W039') });

/** Elevation tiles (API.md "Terrain"): admins upload and remove them; operators may list what is covered. */
export function terrainRoutes(sequelize: Sequelize) {
  const router = Router();

  router.get('/tiles', async (req, res) => {
    const actor = actorOf(req);
    authorize(mayPlan(actor), 'Terrain tiles are for operators and admins.');
    res.json({ data: await listTiles(sequelize), abilities: { upload: isAdmin(actor), delete: isAdmin(actor) } });
  });

  router.post(
    '/tiles',
    (req, _res, next) => {
      authorize(isAdmin(actorOf(req)), 'Only admins upload terrain tiles.');
      next();
    },
    receiveTile,
    async (req, res) => {
      if (!req.file)
        throw Invalid('Attach the tile in the form field "tile": an SRTM .hgt file named like N47W039.hgt.', [{ path: 'tile', message: 'tile is required' }]);
      const bytes = new Uint8Array(req.file.buffer.buffer, req.file.buffer.byteOffset, req.file.buffer.byteLength);
      const tile = parseHgt(req.file.originalname, bytes);
      const saved = await saveTile(sequelize, tile, bytes, actorOf(req).id);
      res
        .status(201)
        .json({ data: { name: saved.name, south: saved.south, west: saved.west, samplesPerSide: saved.samplesPerSide, createdAt: saved.createdAt } });
    },
  );

  router.delete('/tiles/:name', requireRole(isAdmin, 'Only admins remove terrain tiles.'), validate('params', tileParamsSchema), async (req, res) => {
    const { name } = parseTileName(`${res.locals.params.name}.hgt`);
    if (!(await deleteTile(sequelize, name))) throw NotFound(`Terrain tile ${name}`);
    res.status(204).end();
  });
  return router;
}
