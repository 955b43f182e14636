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
const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'parapet-photos-'));
process.env.DATA_DIR = dataDir;
process.env.PHOTO_MAX_BYTES = String(64 * 1024);
const photosDir = path.join(dataDir, 'photos');
const filesOnDisk = () => (fs.existsSync(photosDir) ? fs.readdirSync(photosDir).sort() : []);

const image = (format: 'jpeg' | 'png' | 'webp') =>
  sharp({ create: { width: 64, height: 48, channels: 3, background: '#0a7' } })[format]().toBuffer();

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
  afterAll(() => fs.rmSync(dataDir, { recursive: true, force: true }));

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
    for (const [method, url] of [['get', `/api/v1/sites/${siteId}/photos`], ['post', `/api/v1/sites/${siteId}/photos`], ['get', '/api/v1/photos/1'], ['get', '/api/v1/photos/1/thumbnail'], ['delete', '/api/v1/photos/1']] as const) {
      const res = await request(ctx.app)[method](url);
      expect(res.status, `${method} ${url}`).toBe(401);
    }
  });

  it.each(['jpeg', 'png', 'webp'] as const)('stores a %s under a random name with a thumbnail, whatever the name and type the client claimed', async (format) => {
    const bytes = await image(format);
    const res = await upload(hoodOperator, siteId, bytes, 'holiday.gif', 'application/octet-stream').field('caption', 'Mast from the north');
    expect(res.status).toBe(201);
    const expectedType = { jpeg: 'image/jpeg', png: 'image/png', webp: 'image/webp' }[format];
    expect(res.body.data).toMatchObject({ siteId, contentType: expectedType, sizeBytes: bytes.length, widthPx: 64, heightPx: 48, caption: 'Mast from the north', abilities: { delete: true } });
    expect(JSON.stringify(res.body)).not.toMatch(/holiday|storageKey/);
    const row = await Photo.findByPk(res.body.data.id);
    expect(row!.storageKey).toMatch(/^[0-9a-f]{32}$/);
    expect(filesOnDisk()).toEqual(expect.arrayContaining([row!.storageKey, `${row!.storageKey}.thumb.webp`]));

    const original = await hoodOperator.get(res.body.data.url).buffer(true).parse((r, cb) => { const c: Buffer[] = []; r.on('data', (d: Buffer) => c.push(d)); r.on('end', () => cb(null, Buffer.concat(c))); });
    expect(original.status).toBe(200);
    expect(original.headers['content-type']).toBe(expectedType);
    expect(Buffer.compare(original.body as Buffer, bytes)).toBe(0);
    const thumb = await hoodOperator.get(res.body.data.thumbnailUrl);
    expect(thumb.status).toBe(200);
    expect(thumb.headers['content-type']).toBe('image/webp');
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
    await expectRefused(await upload(hoodOperator, siteId, Buffer.from('GIF89a\x01\x00\x01\x00\x00\x00\x00;'), 'a.png', 'image/png'), 415, 'unsupported_media_type', /JPEG, PNG or WebP/, before);
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

    for (const url of [`/api/v1/sites/${siteId}/photos`, `/api/v1/photos/${id}`, `/api/v1/photos/${id}/thumbnail`]) expect((await call(otherOperator, 'get', url)).status, url).toBe(404);
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
