import { getPhotoFile } from '@/lib/queries/photos';
import { errorResponse, parseId } from './respond';
import { NotFoundError } from '@/lib/errors';

/**
 * Serves a stored photo or thumbnail: its own content type, `nosniff`, a
 * sandboxing Content-Security-Policy, and a year-long immutable cache (a
 * photo's bytes never change under its id).
 */
export async function photoResponse(request: Request, rawId: string, variant: 'full' | 'thumbnail'): Promise<Response> {
  try {
    const id = parseId(rawId);
    const file = id ? await getPhotoFile(id, variant) : null;
    if (!file) throw new NotFoundError('No such photo.');
    const etag = `"photo-${file.id}-${variant}"`;
    const headers = {
      'Content-Type': file.contentType,
      'X-Content-Type-Options': 'nosniff',
      'Cache-Control': 'public, max-age=31536000, immutable',
      'Content-Security-Policy': "default-src 'none'; sandbox",
      'Content-Disposition': `inline; filename="${file.filename}"`,
      ETag: etag,
    };
    if (request.headers.get('if-none-match') === etag) return new Response(null, { status: 304, headers });
    return new Response(new Uint8Array(file.body), { status: 200, headers: { ...headers, 'Content-Length': String(file.body.length) } });
  } catch (err) {
    return errorResponse(err);
  }
}
