import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Photo } from '../../server/models/photo';
import { buildUser, call, signIn, useApi, type Agent } from '../helpers/api';
import { buildNeighbourhood, buildSite } from '../helpers/factories';

// Settings are read when the app is made: a small limit keeps the "too large" file small.
// The store sits under a dot-directory, as in a real install (start.sh keeps its data in .data/).
const scratch = fs.mkdtempSync(path.join(os.tmpdir(), 'parapet-photos-'));
const dataDir = path.join(scratch, '.data', 'uploads');
fs.mkdirSync(dataDir, { recursive: true });
process.env.DATA_DIR = dataDir;
process.env.PHOTO_MAX_BYTES = String(64 * 1024);
const photosDir = path.join(dataDir, 'photos');
const filesOnDisk = () => (fs.existsSync(photosDir) ? fs.readdirSync(photosDir).sort() : []);

const image = (format: 'jpeg' | 'png' | 'webp') =>
  sharp({ create: { width: 64, height: 48, channels: 3, background: '#0a7' } })
    .toFormat(format)
    .toBuffer();

/**
 * The tag ids of a TIFF/EXIF block's first IFD (TIFF 6.0 §2: byte order "II"/"MM", magic 42, offset of IFD0;
 * each entry 12 bytes, tag first). sharp's `metadata().exif` starts with "Exif\0\0" before the TIFF header.
 */
function ifd0Tags(exif: Buffer): number[] {
  const tiff = exif.subarray(exif.toString('latin1', 0, 4) === 'Exif' ? 6 : 0);
  const le = tiff.toString('latin1', 0, 2) === 'II';
  const u16 = (at: number) => (le ? tiff.readUInt16LE(at) : tiff.readUInt16BE(at));
  const u32 = (at: number) => (le ? tiff.readUInt32LE(at) : tiff.readUInt32BE(at));
  const ifd = u32(4);
  return Array.from({ length: u16(ifd) }, (_, i) => u16(ifd + 2 + 12 * i));
}
const ARTIST_TAG = 0x013b; // TIFF 6.0 / CIPA DC-008 (Exif 2.32) tag 315, Artist
const GPS_IFD_TAG = 0x8825; // CIPA DC-008 (Exif 2.32) §4.6.3: GPS Info IFD pointer

/** A phone-like photo: 64 × 32 pixels stored sideways (EXIF orientation 6), with its owner's name and a GPS position. */
const phonePhoto = (format: 'jpeg' | 'png' | 'webp' = 'jpeg') =>
  sharp({ create: { width: 64, height: 32, channels: 3, background: '#0a7' } })
    .toFormat(format)
    .withMetadata({ orientation: 6 })
    .withExifMerge({
      IFD0: { Artist: 'Odile Brenner' },
      IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '52/1 4/1 12/1', GPSLongitudeRef: 'E', GPSLongitude: '4/1 18/1 3/1' },
    })
    .toBuffer();

const bytesOf = (agent: Agent, url: string) =>
  agent
    .get(url)
    .buffer(true)
    .parse((r, cb) => {
      const c: Buffer[] = [];
      r.on('data', (d: Buffer) => c.push(d));
      r.on('end', () => cb(null, Buffer.concat(c)));
    });

describe('site photos API', () => {
  const ctx = useApi();
  let jpeg: Buffer;
  let hoodOperator: Agent;
  let otherOperator: Agent;
  let host: Agent;
  let siteId: number;
  let otherSiteId: number;

  beforeAll(async () => {
    jpeg = await image('jpeg');
    const op = await buildUser({ role: 'operator' });
    const hood = await buildNeighbourhood({ operators: [op] });
    const hostUser = await buildUser({ role: 'host' });
    siteId = (await buildSite({ neighbourhoodId: hood.id, hostUserId: hostUser.id })).id;
    otherSiteId = (await buildSite()).id;
    hoodOperator = await signIn(ctx, op);
    otherOperator = await signIn(ctx, await buildUser({ role: 'operator' }));
    host = await signIn(ctx, hostUser);
  });
  afterAll(() => fs.rmSync(scratch, { recursive: true, force: true }));

  const upload = (agent: Agent, id: number, file: Buffer, filename = 'roof.jpg', contentType = 'image/jpeg', field = 'photo') =>
    agent.post(`/api/v1/sites/${id}/photos`).set('X-CSRF-Token', agent.csrf).attach(field, file, { filename, contentType });

  /** A refused upload must leave no row and no file behind. */
  async function expectRefused(res: request.Response, status: number, code: string, message: RegExp, before: { rows: number; files: string[] }) {
    expect(res.status).toBe(status);
    expect(res.body.error.code).toBe(code);
    expect(res.body.error.message).toMatch(message);
    expect(await Photo.count()).toBe(before.rows);
    expect(filesOnDisk()).toEqual(before.files);
  }
  const snapshot = async () => ({ rows: await Photo.count(), files: filesOnDisk() });

  it('refuses signed-out callers with 401', async () => {
    for (const [method, url] of [
      ['get', `/api/v1/sites/${siteId}/photos`],
      ['post', `/api/v1/sites/${siteId}/photos`],
      ['get', '/api/v1/photos/1'],
      ['get', '/api/v1/photos/1/thumbnail'],
      ['delete', '/api/v1/photos/1'],
    ] as const) {
      const res = await request(ctx.app)[method](url);
      expect(res.status, `${method} ${url}`).toBe(401);
    }
  });

  it.each(['jpeg', 'png', 'webp'] as const)(
    'stores a %s under a random name with a thumbnail, whatever the name and type the client claimed',
    async (format) => {
      const bytes = await image(format);
      const res = await upload(hoodOperator, siteId, bytes, 'holiday.gif', 'application/octet-stream').field('caption', 'Mast from the north');
      expect(res.status).toBe(201);
      const expectedType = { jpeg: 'image/jpeg', png: 'image/png', webp: 'image/webp' }[format];
      expect(res.body.data).toMatchObject({
        siteId,
        contentType: expectedType,
        widthPx: 64,
        heightPx: 48,
        caption: 'Mast from the north',
        abilities: { delete: true },
      });
      expect(JSON.stringify(res.body)).not.toMatch(/holiday|storageKey/);
      const row = await Photo.findByPk(res.body.data.id);
      expect(row!.storageKey).toMatch(/^[0-9a-f]{32}$/);
      expect(filesOnDisk()).toEqual(expect.arrayContaining([row!.storageKey, `${row!.storageKey}.thumb.webp`]));
      const stored = fs.readFileSync(path.join(photosDir, row!.storageKey));
      expect(res.body.data.sizeBytes).toBe(stored.length);

      // Downloads work from a store under a dot-directory, and give back exactly the stored picture.
      const original = await bytesOf(hoodOperator, res.body.data.url);
      expect(original.status).toBe(200);
      expect(original.headers['content-type']).toBe(expectedType);
      expect(original.headers['content-disposition']).toMatch(new RegExp(`filename="site-${siteId}-photo-${row!.id}\\.`));
      expect(Buffer.compare(original.body as Buffer, stored)).toBe(0);
      expect(await sharp(original.body as Buffer).metadata()).toMatchObject({ format: format, width: 64, height: 48 });
      const thumb = await bytesOf(hoodOperator, res.body.data.thumbnailUrl);
      expect(thumb.status).toBe(200);
      expect(thumb.headers['content-type']).toBe('image/webp');
      expect(await sharp(thumb.body as Buffer).metadata()).toMatchObject({ format: 'webp' });
    },
  );

  it.each(['jpeg', 'png', 'webp'] as const)(
    'keeps no EXIF of a %s upload (owner, GPS position), and turns the picture upright from its orientation',
    async (format) => {
      const upload0 = await phonePhoto(format);
      const sent = await sharp(upload0).metadata();
      // The fixture really carries what must go: orientation 6, the owner's name and a GPS block.
      expect(sent).toMatchObject({ width: 64, height: 32, orientation: 6 });
      expect(ifd0Tags(sent.exif!)).toEqual(expect.arrayContaining([ARTIST_TAG, GPS_IFD_TAG]));
      expect(upload0.toString('latin1')).toContain('Odile Brenner');

      const res = await upload(hoodOperator, siteId, upload0, `IMG_2041.${format}`, `image/${format}`);
      expect(res.status).toBe(201);
      // Orientation 6 is "rotate 90° clockwise to view" (CIPA DC-008 tag 274), so 64 × 32 stands up as 32 × 64.
      expect(res.body.data).toMatchObject({ contentType: `image/${format}`, widthPx: 32, heightPx: 64 });
      const row = await Photo.findByPk(res.body.data.id);
      for (const file of [row!.storageKey, `${row!.storageKey}.thumb.webp`]) {
        const bytes = fs.readFileSync(path.join(photosDir, file));
        const meta = await sharp(bytes).metadata();
        expect(meta.exif, file).toBeUndefined();
        expect(meta.xmp, file).toBeUndefined();
        expect(meta.orientation, file).toBeUndefined();
        expect(bytes.toString('latin1'), file).not.toContain('Odile Brenner');
        expect([meta.width, meta.height], file).toEqual([32, 64]);
      }
      const downloaded = await bytesOf(hoodOperator, res.body.data.url);
      expect(downloaded.status).toBe(200);
      expect((await sharp(downloaded.body as Buffer).metadata()).exif).toBeUndefined();
    },
  );

  it('answers a photo whose file went missing with a JSON 404, not an empty picture', async () => {
    const res = await upload(hoodOperator, siteId, jpeg);
    expect(res.status).toBe(201);
    const row = await Photo.findByPk(res.body.data.id);
    fs.rmSync(path.join(photosDir, row!.storageKey));
    fs.rmSync(path.join(photosDir, `${row!.storageKey}.thumb.webp`));
    for (const url of [res.body.data.url, res.body.data.thumbnailUrl]) {
      const missing = await call(hoodOperator, 'get', url);
      expect(missing.status, url).toBe(404);
      expect(missing.headers['content-type'], url).toMatch(/^application\/json/);
      expect(missing.headers['content-disposition'], url).toBeUndefined();
      expect(missing.body.error).toMatchObject({
        code: 'photo_file_missing',
        message: expect.stringMatching(/missing on the server.*restore it from a backup/),
      });
    }
    expect((await call(hoodOperator, 'delete', res.body.data.url)).status).toBe(204);
  });

  it('ignores a path-traversal file name: the file lands only under the photos folder, under its random name', async () => {
    const before = filesOnDisk();
    const res = await upload(hoodOperator, siteId, jpeg, '../../../../etc/passwd.jpg');
    expect(res.status).toBe(201);
    const added = filesOnDisk().filter((f) => !before.includes(f));
    expect(added).toHaveLength(2);
    for (const f of added) expect(f).toMatch(/^[0-9a-f]{32}(\.thumb\.webp)?$/);
    expect(fs.readdirSync(dataDir)).toEqual(['photos']);
    for (const up of ['..', '../..', '../../..']) expect(fs.existsSync(path.resolve(photosDir, up, 'etc/passwd.jpg'))).toBe(false);
    expect(fs.existsSync('/etc/passwd.jpg')).toBe(false);
    expect(JSON.stringify(res.body)).not.toContain('passwd');
  });

  it('refuses a text file dressed as a JPEG with 415 and keeps nothing', async () => {
    const before = await snapshot();
    const res = await upload(hoodOperator, siteId, Buffer.from('root:x:0:0:root:/root:/bin/sh\n'), 'photo.jpg', 'image/jpeg');
    await expectRefused(res, 415, 'unsupported_media_type', /not a JPEG, PNG or WebP photo/, before);
  });

  it('refuses a GIF, and a file that starts like a PNG but is not one, with 415', async () => {
    const before = await snapshot();
    await expectRefused(
      await upload(hoodOperator, siteId, Buffer.from('GIF89a\x01\x00\x01\x00\x00\x00\x00;'), 'a.png', 'image/png'),
      415,
      'unsupported_media_type',
      /JPEG, PNG or WebP/,
      before,
    );
    const fakePng = Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), Buffer.alloc(200, 7)]);
    await expectRefused(await upload(hoodOperator, siteId, fakePng, 'b.png', 'image/png'), 415, 'unreadable_image', /could not be read/, before);
  });

  it('refuses a file over the size limit with 413 and keeps nothing', async () => {
    const before = await snapshot();
    const big = Buffer.concat([jpeg, Buffer.alloc(70 * 1024, 1)]);
    await expectRefused(await upload(hoodOperator, siteId, big), 413, 'too_large', /larger than 64 KiB/, before);
  });

  it('answers 400 when no file is sent, or it is sent under another field name', async () => {
    const before = await snapshot();
    const none = await call(hoodOperator, 'post', `/api/v1/sites/${siteId}/photos`, {});
    await expectRefused(none, 400, 'invalid_input', /No photo was sent/, before);
    await expectRefused(await upload(hoodOperator, siteId, jpeg, 'a.jpg', 'image/jpeg', 'picture'), 400, 'invalid_input', /form field "photo"/, before);
    const longCaption = await upload(hoodOperator, siteId, jpeg).field('caption', 'x'.repeat(201));
    await expectRefused(longCaption, 400, 'invalid_input', /caption must be at most 200 characters/, before);
    expect((await call(hoodOperator, 'get', '/api/v1/sites/abc/photos')).status).toBe(400);
  });

  it('lets the host add photos but not remove them; others cannot see the site’s photos at all', async () => {
    const res = await upload(host, siteId, jpeg);
    expect(res.status).toBe(201);
    expect(res.body.data.abilities).toEqual({ delete: false });
    const id = res.body.data.id;
    const del = await call(host, 'delete', `/api/v1/photos/${id}`);
    expect(del.status).toBe(403);
    expect(del.body.error.message).toBe('Only admins and the operators of its neighbourhood remove photos of this site.');

    for (const url of [`/api/v1/sites/${siteId}/photos`, `/api/v1/photos/${id}`, `/api/v1/photos/${id}/thumbnail`])
      expect((await call(otherOperator, 'get', url)).status, url).toBe(404);
    expect((await call(otherOperator, 'delete', `/api/v1/photos/${id}`)).status).toBe(404);
    const before = await snapshot();
    await expectRefused(await upload(otherOperator, siteId, jpeg), 404, 'not_found', /Site \d+ was not found/, before);
    await expectRefused(await upload(host, otherSiteId, jpeg), 404, 'not_found', /was not found/, before);
    expect((await call(hoodOperator, 'get', '/api/v1/photos/999999')).status).toBe(404);
  });

  it('lists a site’s photos newest first, and removing one deletes its row and both files', async () => {
    const list = await call(hoodOperator, 'get', `/api/v1/sites/${siteId}/photos`);
    expect(list.status).toBe(200);
    expect(list.body.abilities).toEqual({ create: true });
    expect(list.body.data.length).toBe(await Photo.count({ where: { siteId } }));
    const ids = list.body.data.map((p: { id: number }) => p.id);
    expect(ids).toEqual([...ids].sort((a, b) => b - a));
    const target = await Photo.findByPk(ids[0]);
    const res = await call(hoodOperator, 'delete', `/api/v1/photos/${target!.id}`);
    expect(res.status).toBe(204);
    expect(await Photo.findByPk(target!.id)).toBeNull();
    expect(filesOnDisk()).not.toContain(target!.storageKey);
    expect(filesOnDisk()).not.toContain(`${target!.storageKey}.thumb.webp`);
    expect((await call(hoodOperator, 'get', `/api/v1/photos/${target!.id}`)).status).toBe(404);
  });
});
