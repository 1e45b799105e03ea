/** Largest upload accepted, in bytes (10 MB). Shared by the server and the upload field. */
export const PHOTO_MAX_BYTES = 10 * 1024 * 1024;
/** Largest image accepted, in pixels (40 megapixels): a guard against decompression bombs. */
export const PHOTO_MAX_PIXELS = 40_000_000;
