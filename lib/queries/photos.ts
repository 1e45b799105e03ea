import 'server-only';
import { Photo } from '@/db/models';
import { THUMB_CONTENT_TYPE } from '@/lib/photos/process';
import { getStorage, type Storage } from '@/lib/storage';

/** A photo file ready to serve. */
export interface PhotoFile {
  id: number;
  body: Buffer;
  contentType: string;
  filename: string;
}

/**
 * The stored bytes of a photo (`full`) or its thumbnail; null when there is
 * no such photo or its file is missing. Photos are public, like their trials.
 */
export async function getPhotoFile(id: number, variant: 'full' | 'thumbnail', storage: Storage = getStorage()): Promise<PhotoFile | null> {
  const photo = await Photo.findByPk(id, { attributes: ['id', 'storageKey', 'thumbKey', 'contentType'] });
  if (!photo) return null;
  const key = variant === 'full' ? photo.storageKey : photo.thumbKey;
  const object = await storage.get(key);
  if (!object) return null;
  const contentType = variant === 'full' ? photo.contentType : THUMB_CONTENT_TYPE;
  const ext = contentType.split('/')[1] === 'jpeg' ? 'jpg' : contentType.split('/')[1];
  return { id: photo.id, body: object.body, contentType, filename: `trialbed-photo-${photo.id}${variant === 'full' ? '' : '-thumb'}.${ext}` };
}
