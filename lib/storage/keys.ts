import { randomUUID } from 'node:crypto';

/** File extension and content type of each stored image format. */
export const IMAGE_TYPES = {
  jpeg: { ext: 'jpg', contentType: 'image/jpeg' },
  png: { ext: 'png', contentType: 'image/png' },
  webp: { ext: 'webp', contentType: 'image/webp' },
} as const;
export type ImageFormat = keyof typeof IMAGE_TYPES;

const KEY_PATTERN = /^(?:photos|demo)\/(?:[a-z0-9][a-z0-9-]{0,80}\/){0,2}[a-z0-9][a-z0-9-]{0,120}\.(?:jpg|png|webp)$/;

/** True for a key the server could have made (no traversal, no odd characters). */
export function isStorageKey(key: string): boolean {
  return KEY_PATTERN.test(key);
}

/** Throws when `key` is not one of ours; drivers call it on every operation. */
export function assertStorageKey(key: string): void {
  if (!isStorageKey(key)) throw new Error(`refused storage key: ${JSON.stringify(key).slice(0, 80)}`);
}

/** Content type of a stored object, from its key's extension. */
export function contentTypeOfKey(key: string): string {
  if (key.endsWith('.jpg')) return 'image/jpeg';
  if (key.endsWith('.png')) return 'image/png';
  if (key.endsWith('.webp')) return 'image/webp';
  return 'application/octet-stream';
}

/**
 * Fresh keys for an uploaded photo and its thumbnail: a random name under the
 * month of upload. Nothing in them comes from the uploader.
 */
export function newPhotoKeys(format: ImageFormat, now = new Date()): { key: string; thumbKey: string } {
  const month = now.toISOString().slice(0, 7);
  const name = randomUUID();
  return { key: `photos/${month}/${name}.${IMAGE_TYPES[format].ext}`, thumbKey: `photos/${month}/${name}-thumb.webp` };
}
