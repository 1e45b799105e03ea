import { photoResponse } from '@/lib/http/photo-response';

export const dynamic = 'force-dynamic';

/** A photo's WebP thumbnail. */
export async function GET(request: Request, { params }: { params: Promise<{ id: string }> }) {
  return photoResponse(request, (await params).id, 'thumbnail');
}
