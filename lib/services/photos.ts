import 'server-only';
import { sequelize } from '@/db';
import { CheckIn, Photo, Trial } from '@/db/models';
import { InvalidInputError, NotFoundError } from '@/lib/errors';
import { processPhoto, THUMB_CONTENT_TYPE } from '@/lib/photos/process';
import { authorizeUser, type Actor } from '@/lib/policies';
import { getStorage, newPhotoKeys, type Storage } from '@/lib/storage';
import { PhotoUploadQuerySchema } from '@/lib/validation/trials';
import { toPhotoDto, type PhotoDto } from '@/lib/photos/dto';
import { recomputeFeedstock } from './evidence';

export type { PhotoDto } from '@/lib/photos/dto';

/**
 * Checks that the actor may add photos to the trial, before a route reads the
 * upload body. Throws UnauthenticatedError (401), ForbiddenError (403) or
 * NotFoundError (404).
 */
export async function assertCanUploadPhoto(actor: Actor, trialId: number): Promise<void> {
  const trial = await Trial.findByPk(trialId, { attributes: ['id', 'ownerId'] });
  if (!trial) throw new NotFoundError('No such trial.');
  authorizeUser(actor, 'photo.upload', { ownerId: trial.ownerId });
}

/**
 * Adds a photo to a trial (optionally to one of its check-ins). The file is
 * judged by its content and re-encoded without metadata (lib/photos/process.ts),
 * stored with a thumbnail under server-made keys, and recorded with the
 * feedstock's evidence recomputed in one transaction (photos count towards
 * certainty). If the database write fails the stored objects are removed.
 * Throws 401/403/404, 413 (too big), 415 (not JPEG/PNG/WebP) or 400.
 */
export async function uploadPhoto(
  actor: Actor,
  trialId: number,
  bytes: Buffer,
  rawOptions: unknown = {},
  storage: Storage = getStorage(),
): Promise<PhotoDto> {
  const trial = await Trial.findByPk(trialId);
  if (!trial) throw new NotFoundError('No such trial.');
  authorizeUser(actor, 'photo.upload', { ownerId: trial.ownerId });
  const options = PhotoUploadQuerySchema.parse(rawOptions);
  if (options.checkInId) {
    const checkIn = await CheckIn.findByPk(options.checkInId, { attributes: ['id', 'trialId'] });
    if (!checkIn || checkIn.trialId !== trial.id) {
      throw new InvalidInputError(undefined, { checkInId: ['That check-in is not part of this trial.'] });
    }
  }
  const processed = await processPhoto(bytes);
  const keys = newPhotoKeys(processed.format);
  await storage.put(keys.key, processed.full, processed.contentType);
  try {
    await storage.put(keys.thumbKey, processed.thumb, THUMB_CONTENT_TYPE);
    const photo = await sequelize.transaction(async (transaction) => {
      // The trial may have gone while the image was being processed.
      const locked = await Trial.findByPk(trial.id, { transaction, lock: transaction.LOCK.UPDATE, attributes: ['id', 'feedstockId'] });
      if (!locked) throw new NotFoundError('No such trial.');
      const row = await Photo.create(
        {
          trialId: trial.id,
          checkInId: options.checkInId ?? null,
          uploaderId: actor.id,
          storageKey: keys.key,
          thumbKey: keys.thumbKey,
          contentType: processed.contentType,
          width: processed.width,
          height: processed.height,
          bytes: processed.full.length,
          caption: options.caption,
        },
        { transaction },
      );
      await recomputeFeedstock(locked.feedstockId, transaction);
      return row;
    });
    return toPhotoDto(photo);
  } catch (err) {
    await Promise.allSettled([storage.delete(keys.key), storage.delete(keys.thumbKey)]);
    throw err;
  }
}

/**
 * Removes a photo (the trial's owner, or a moderator) and recomputes the
 * feedstock's evidence in the same transaction; the stored files go after the
 * commit. Throws 401/403/404.
 */
export async function deletePhoto(actor: Actor, photoId: number, storage: Storage = getStorage()): Promise<{ trialId: number }> {
  const { keys, trialId } = await sequelize.transaction(async (transaction) => {
    const photo = await Photo.findByPk(photoId, { transaction, lock: transaction.LOCK.UPDATE });
    const trial = photo ? await Trial.findByPk(photo.trialId, { transaction, attributes: ['id', 'ownerId', 'feedstockId'] }) : null;
    if (!photo || !trial) throw new NotFoundError('No such photo.');
    authorizeUser(actor, 'trial.update', { ownerId: trial.ownerId });
    await photo.destroy({ transaction });
    await recomputeFeedstock(trial.feedstockId, transaction);
    return { keys: [photo.storageKey, photo.thumbKey], trialId: trial.id };
  });
  const results = await Promise.allSettled(keys.map((k) => storage.delete(k)));
  for (const r of results) if (r.status === 'rejected') console.error('photo file left behind:', r.reason);
  return { trialId };
}
