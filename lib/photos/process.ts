import 'server-only';
import sharp from 'sharp';
import { InvalidInputError, PayloadTooLargeError, UnsupportedMediaTypeError } from '@/lib/errors';
import { IMAGE_TYPES, type ImageFormat } from '@/lib/storage/keys';

import { PHOTO_MAX_BYTES, PHOTO_MAX_PIXELS } from './limits';

export { PHOTO_MAX_BYTES, PHOTO_MAX_PIXELS };
/** Stored photos are scaled down to fit this many pixels on the long edge. */
export const PHOTO_MAX_EDGE = 2560;
/** Thumbnails fit this many pixels on the long edge (WebP). */
export const THUMB_MAX_EDGE = 480;
/** Content type of every thumbnail. */
export const THUMB_CONTENT_TYPE = 'image/webp';

const NOT_ACCEPTED = 'Only JPEG, PNG or WebP photos are accepted.';
const NOT_READABLE = 'This file is not a readable JPEG, PNG or WebP image.';

/**
 * The image format a file's first bytes announce (its "magic number"), or null.
 * JPEG: FF D8 FF. PNG: 89 50 4E 47 0D 0A 1A 0A. WebP: "RIFF" <size> "WEBP".
 * The file name and declared type are never consulted.
 */
export function sniffImageFormat(bytes: Uint8Array): ImageFormat | null {
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return 'jpeg';
  const png = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
  if (bytes.length >= 8 && png.every((b, i) => bytes[i] === b)) return 'png';
  const ascii = (from: number, to: number) => String.fromCharCode(...bytes.subarray(from, to));
  if (bytes.length >= 12 && ascii(0, 4) === 'RIFF' && ascii(8, 12) === 'WEBP') return 'webp';
  return null;
}

/** A re-encoded photo and its thumbnail, ready to store. */
export interface ProcessedPhoto {
  format: ImageFormat;
  contentType: string;
  full: Buffer;
  thumb: Buffer;
  width: number;
  height: number;
}

/**
 * Checks an uploaded file by its content and re-encodes it:
 * - more than PHOTO_MAX_BYTES → PayloadTooLargeError (413);
 * - not JPEG, PNG or WebP by its magic bytes (HTML, SVG, GIF …) → UnsupportedMediaTypeError (415);
 * - announces one format but is not a readable image of it (a polyglot or a
 *   broken file), or has more than PHOTO_MAX_PIXELS → InvalidInputError (400).
 * The output is decoded and encoded afresh in the same format, turned upright
 * from its EXIF orientation, scaled to fit PHOTO_MAX_EDGE, with no metadata at
 * all (EXIF with GPS, XMP, IPTC, ICC, comments) and nothing appended; plus a
 * WebP thumbnail.
 */
export async function processPhoto(input: Buffer): Promise<ProcessedPhoto> {
  if (input.length > PHOTO_MAX_BYTES) throw new PayloadTooLargeError('Photos can be at most 10 MB.');
  const format = sniffImageFormat(input);
  if (!format) throw new UnsupportedMediaTypeError(NOT_ACCEPTED, { photo: [NOT_ACCEPTED] });

  const options = { limitInputPixels: PHOTO_MAX_PIXELS, failOn: 'error' as const };
  // The header alone (no pixel limit here, nothing is decoded): check the size before decoding.
  const meta = await sharp(input, { limitInputPixels: false, failOn: 'error' })
    .metadata()
    .catch(() => null);
  if (!meta || meta.format !== format) throw new InvalidInputError(NOT_READABLE, { photo: [NOT_READABLE] });
  const pixels = (meta.width ?? 0) * (meta.height ?? 0);
  if (!pixels) throw new InvalidInputError(NOT_READABLE, { photo: [NOT_READABLE] });
  if (pixels > PHOTO_MAX_PIXELS) {
    const message = `This image has too many pixels (at most ${PHOTO_MAX_PIXELS / 1_000_000} megapixels).`;
    throw new InvalidInputError(message, { photo: [message] });
  }

  try {
    // Only the first frame of an animated WebP; auto-orient before the orientation tag is dropped.
    const base = sharp(input, options).rotate();
    const scaled = base.clone().resize({ width: PHOTO_MAX_EDGE, height: PHOTO_MAX_EDGE, fit: 'inside', withoutEnlargement: true });
    const encoded =
      format === 'jpeg'
        ? scaled.jpeg({ quality: 82, mozjpeg: true })
        : format === 'png'
          ? scaled.png({ compressionLevel: 9, effort: 4 })
          : scaled.webp({ quality: 80 });
    const [full, thumb] = await Promise.all([
      encoded.toBuffer({ resolveWithObject: true }),
      base
        .clone()
        .resize({ width: THUMB_MAX_EDGE, height: THUMB_MAX_EDGE, fit: 'inside', withoutEnlargement: true })
        .webp({ quality: 70 })
        .toBuffer(),
    ]);
    return { format, contentType: IMAGE_TYPES[format].contentType, full: full.data, thumb, width: full.info.width, height: full.info.height };
  } catch {
    throw new InvalidInputError(NOT_READABLE, { photo: [NOT_READABLE] });
  }
}
