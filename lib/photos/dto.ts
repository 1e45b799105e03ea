import type { Photo } from '@/db/models';

/** A stored photo as pages and the API see it. */
export interface PhotoDto {
  id: number;
  trialId: number;
  checkInId: number | null;
  url: string;
  thumbUrl: string;
  contentType: string;
  width: number;
  height: number;
  bytes: number;
  caption: string;
}

/** The public addresses of a photo and its thumbnail (served by app/api/photos). */
export function photoUrls(id: number): { url: string; thumbUrl: string } {
  return { url: `/api/photos/${id}`, thumbUrl: `/api/photos/${id}/thumbnail` };
}

/** Turns a Photo row into its DTO. */
export function toPhotoDto(p: Photo): PhotoDto {
  return {
    id: p.id,
    trialId: p.trialId,
    checkInId: p.checkInId ?? null,
    ...photoUrls(p.id),
    contentType: p.contentType,
    width: p.width,
    height: p.height,
    bytes: p.bytes,
    caption: p.caption,
  };
}
