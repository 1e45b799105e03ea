import { revalidateTag } from 'next/cache';
import { NextResponse, type NextRequest } from 'next/server';
import { getActor } from '@/lib/auth/actor';
import { FEEDSTOCKS_TAG, feedstockTag } from '@/lib/cache-tags';
import { InvalidInputError, NotFoundError, toErrorResponse } from '@/lib/errors';
import { resolveFeedstockSlug } from '@/lib/queries/feedstocks';
import { invalidateSearchIndex } from '@/lib/queries/search';
import { submitPageEdit } from '@/lib/services/revisions';

/**
 * POST /api/feedstocks/[slug]/revisions — a page-text edit as JSON
 * `{ body, editSummary?, baseVersion }`. Editors publish (201, status
 * "published"); contributors' edits wait for review (201, status "pending").
 * An edit against an older text version answers 409 with what changed;
 * 401/403 per policy; 400 with field messages for bad input.
 */
export async function POST(request: NextRequest, { params }: { params: Promise<{ slug: string }> }) {
  try {
    const { slug } = await params;
    const resolved = await resolveFeedstockSlug(slug);
    let id: number;
    if (resolved.kind === 'found') id = resolved.id;
    else if (resolved.kind === 'redirect') {
      const target = await resolveFeedstockSlug(resolved.slug);
      if (target.kind !== 'found') throw new NotFoundError('No such feedstock.');
      id = target.id;
    } else throw new NotFoundError('No such feedstock.');
    // JSON only: a cross-site HTML form cannot send this content type without a CORS preflight.
    if (!(request.headers.get('content-type') ?? '').toLowerCase().startsWith('application/json')) {
      throw new InvalidInputError('Send the edit as JSON.', { _form: ['Content-Type must be application/json.'] });
    }
    let json: unknown;
    try {
      json = await request.json();
    } catch {
      throw new InvalidInputError('The body must be JSON.', { _form: ['Send { "body": "…", "baseVersion": n } as JSON.'] });
    }
    const result = await submitPageEdit(await getActor(), id, json);
    if (result.status === 'published') {
      revalidateTag(feedstockTag(id), { expire: 0 });
      revalidateTag(FEEDSTOCKS_TAG, { expire: 0 });
      invalidateSearchIndex();
    }
    return NextResponse.json(result, { status: 201 });
  } catch (err) {
    const { status, body } = toErrorResponse(err);
    return NextResponse.json(body, { status });
  }
}
