import path from 'node:path';
import { Router, type NextFunction, type Response } from 'express';
import type { Sequelize } from 'sequelize';
import { idParamsSchema } from '../../shared/schemas/common';
import { photoCaptionSchema } from '../../shared/schemas/photo';
import { ApiError, NotFound } from '../errors';
import type { Config } from '../config';
import { actorOf } from '../middlewares/requireUser';
import { requireFile, singleUpload } from '../middlewares/upload';
import { parseOrThrow, validate } from '../middlewares/validate';
import { Photo, usePhotoModel } from '../models/photo';
import type { Actor } from '../policies/actor';
import { authorize } from '../policies/authorize';
import { mayAddPhoto, photoAbilities } from '../policies/photo';
import { presentPhoto } from '../presenters/photo';
import { photoStore, preparePhoto } from '../services/photoStore';
import { readableSite } from '../services/references';

const EXT = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/webp': 'webp' } as const;

/** Mounted at /sites/:id/photos: the list and uploads of one site's install photos. */
export function sitePhotoRoutes(sequelize: Sequelize, settings: Config) {
  usePhotoModel(sequelize);
  const store = photoStore(settings.dataDir);
  const router = Router({ mergeParams: true });

  router.get('/', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const site = await readableSite(actor, res.locals.params.id);
    const photos = await Photo.findAll({
      where: { siteId: site.id },
      order: [
        ['createdAt', 'DESC'],
        ['id', 'DESC'],
      ],
    });
    res.json({ data: photos.map((p) => presentPhoto(p, photoAbilities(actor, site))), abilities: { create: mayAddPhoto(actor, site) } });
  });

  router.post('/', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const site = await readableSite(actor, res.locals.params.id);
    authorize(mayAddPhoto(actor, site), 'Only admins, the operators of its neighbourhood and its host add photos to this site.');
    await new Promise<void>((resolve, reject) =>
      singleUpload('photo', settings.photoMaxBytes, 'photo')(req, res, (err?: unknown) => (err ? reject(err) : resolve())),
    );
    const file = requireFile(req, 'photo', 'photo');
    const { caption } = parseOrThrow(photoCaptionSchema, { caption: req.body?.caption || undefined }, 'photo form');
    const prepared = await preparePhoto(file.buffer);
    const key = store.newKey();
    // Only the cleaned picture is kept: the uploaded bytes may carry where it was taken and who took it.
    await store.write(key, prepared.original, prepared.thumbnail);
    try {
      const photo = await Photo.create({
        siteId: site.id,
        storageKey: key,
        contentType: prepared.contentType,
        sizeBytes: prepared.original.length,
        widthPx: prepared.widthPx,
        heightPx: prepared.heightPx,
        hasThumbnail: true,
        caption: caption ?? null,
        uploadedBy: actor.id,
      });
      res.status(201).json({ data: presentPhoto(photo, photoAbilities(actor, site)) });
    } catch (err) {
      await store.remove(key); // the row failed, so the files must not stay behind
      throw err;
    }
  });

  return router;
}

/** Mounted at /photos: one photo's file, thumbnail and removal, read through its site's scope. */
export function photoRoutes(sequelize: Sequelize, settings: Config) {
  usePhotoModel(sequelize);
  const store = photoStore(settings.dataDir);
  const router = Router();

  async function readablePhoto(actor: Actor, id: number) {
    const photo = await Photo.findByPk(id);
    if (!photo) throw NotFound(`Photo ${id}`);
    try {
      return { photo, site: await readableSite(actor, photo.siteId) };
    } catch {
      throw NotFound(`Photo ${id}`); // a photo of a site you cannot read does not exist for you
    }
  }

  // Served relative to the store's folder: send refuses any path with a dot-segment ("dotfiles"), and the
  // store of a real install lives under .data/; with `root` only the file's own name is checked.
  // The headers go through sendFile so they are set only when the file is really sent, and a missing
  // file is answered as JSON, not under the picture's content type.
  const send = (res: Response, next: NextFunction, file: string, type: string, name: string) => {
    const headers = { 'Content-Type': type, 'Cache-Control': 'private, max-age=3600', 'Content-Disposition': `inline; filename="${name}"` };
    res.sendFile(path.basename(file), { root: store.dir, headers, dotfiles: 'deny' }, (err?: Error & { code?: string }) => {
      if (!err || err.code === 'ECONNABORTED' || res.headersSent) return; // sent, or the client went away mid-file
      next(
        new ApiError(
          404,
          'photo_file_missing',
          'The file of this photo is missing on the server. Ask an admin to restore it from a backup, or remove the photo and upload it again.',
        ),
      );
    });
  };

  router.get('/:id', validate('params', idParamsSchema), async (req, res, next) => {
    const { photo } = await readablePhoto(actorOf(req), res.locals.params.id);
    send(res, next, store.fileOf(photo.storageKey), photo.contentType, `site-${photo.siteId}-photo-${photo.id}.${EXT[photo.contentType]}`);
  });

  router.get('/:id/thumbnail', validate('params', idParamsSchema), async (req, res, next) => {
    const { photo } = await readablePhoto(actorOf(req), res.locals.params.id);
    if (!photo.hasThumbnail) throw NotFound(`A thumbnail of photo ${photo.id}`);
    send(res, next, store.thumbOf(photo.storageKey), 'image/webp', `site-${photo.siteId}-photo-${photo.id}-small.webp`);
  });

  router.delete('/:id', validate('params', idParamsSchema), async (req, res) => {
    const actor = actorOf(req);
    const { photo, site } = await readablePhoto(actor, res.locals.params.id);
    authorize(photoAbilities(actor, site).delete, 'Only admins and the operators of its neighbourhood remove photos of this site.');
    await photo.destroy();
    await store.remove(photo.storageKey);
    res.status(204).end();
  });

  return router;
}
