import { randomBytes } from 'node:crypto';
import fs from 'node:fs/promises';
import path from 'node:path';
import sharp from 'sharp';
import { ApiError } from '../errors';

export const PHOTO_TYPES = { jpeg: 'image/jpeg', png: 'image/png', webp: 'image/webp' } as const;
export type PhotoContentType = (typeof PHOTO_TYPES)[keyof typeof PHOTO_TYPES];

// Magic numbers: JPEG FF D8 FF (ISO/IEC 10918-1), PNG's 8-byte signature (RFC 2083 §3.1),
// WebP "RIFF....WEBP" (RFC 9649 §2). The name and the Content-Type the client sent are never read.
export function sniffImageType(bytes: Buffer): PhotoContentType | null {
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return PHOTO_TYPES.jpeg;
  if (bytes.length >= 8 && bytes.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return PHOTO_TYPES.png;
  if (bytes.length >= 12 && bytes.toString('latin1', 0, 4) === 'RIFF' && bytes.toString('latin1', 8, 12) === 'WEBP') return PHOTO_TYPES.webp;
  return null;
}

const unsupported = () =>
  new ApiError(415, 'unsupported_media_type', 'That file is not a JPEG, PNG or WebP photo. Export the picture as one of those and try again.');

export interface PreparedPhoto {
  contentType: PhotoContentType;
  /** The picture as stored: upright, with its EXIF, XMP and text metadata (GPS, camera owner, …) removed. */
  original: Buffer;
  widthPx: number | null;
  heightPx: number | null;
  thumbnail: Buffer;
}

type PhotoFormat = keyof typeof PHOTO_TYPES;

// Re-encoded in the format it came in; PNG stays lossless. The colour profile is kept: it holds no personal data.
function encode(image: sharp.Sharp, format: PhotoFormat): sharp.Sharp {
  const kept = image.keepIccProfile();
  if (format === 'jpeg') return kept.jpeg({ quality: 90 });
  if (format === 'png') return kept.png();
  return kept.webp({ quality: 90 });
}

/**
 * Checks the bytes really are a photo of an allowed type, turns it upright from its EXIF orientation and
 * re-encodes it without metadata (sharp drops EXIF, XMP and IPTC unless asked to keep them), and makes a
 * 320 px WebP thumbnail. Phones write the place a photo was taken and often the owner's name into EXIF.
 */
export async function preparePhoto(bytes: Buffer): Promise<PreparedPhoto> {
  const contentType = sniffImageType(bytes);
  if (!contentType) throw unsupported();
  try {
    // A decompression bomb stops at 50 megapixels; the format sharp decodes must match the sniffed one.
    const image = sharp(bytes, { limitInputPixels: 50_000_000, failOn: 'error' });
    const meta = await image.metadata();
    const format = meta.format as PhotoFormat | undefined;
    if (!format || PHOTO_TYPES[format] !== contentType) throw unsupported();
    const upright = image.rotate(); // applies the EXIF orientation, so the picture needs no Orientation tag
    const [original, thumbnail] = await Promise.all([
      encode(upright.clone(), format).toBuffer({ resolveWithObject: true }),
      upright.clone().resize({ width: 320, height: 320, fit: 'inside', withoutEnlargement: true }).webp({ quality: 75 }).toBuffer(),
    ]);
    return { contentType, original: original.data, widthPx: original.info.width ?? null, heightPx: original.info.height ?? null, thumbnail };
  } catch (err) {
    if (err instanceof ApiError) throw err;
    throw new ApiError(415, 'unreadable_image', 'The photo could not be read: the file looks damaged or is not an image. Try exporting it again.');
  }
}

/** Files are named only by a random key made here; nothing the uploader sent reaches a path. */
export function photoStore(dataDir: string) {
  const dir = path.resolve(dataDir, 'photos');
  const fileOf = (key: string) => {
    if (!/^[0-9a-f]{32}$/.test(key)) throw new Error('bad storage key');
    return path.join(dir, key);
  };
  const thumbOf = (key: string) => `${fileOf(key)}.thumb.webp`;
  return {
    /** The folder the files live in; files are served relative to it (see routes/photos.ts). */
    dir,
    newKey: () => randomBytes(16).toString('hex'),
    fileOf,
    thumbOf,
    async write(key: string, original: Buffer, thumbnail: Buffer) {
      await fs.mkdir(dir, { recursive: true });
      try {
        await fs.writeFile(fileOf(key), original, { flag: 'wx' });
        await fs.writeFile(thumbOf(key), thumbnail, { flag: 'wx' });
      } catch (err) {
        await this.remove(key);
        throw err;
      }
    },
    async remove(key: string) {
      await Promise.all([fs.rm(fileOf(key), { force: true }), fs.rm(thumbOf(key), { force: true })]);
    },
  };
}
export type PhotoStore = ReturnType<typeof photoStore>;
