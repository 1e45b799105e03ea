import { NextResponse, type NextRequest } from 'next/server';
import { toErrorResponse } from '@/lib/errors';
import { searchFeedstocks } from '@/lib/queries/search';
import type { SearchHit } from '@/lib/search/engine';
import { SearchQuerySchema } from '@/lib/validation/feedstocks';

/**
 * GET /api/search?q=…&limit=… — feedstocks matching a question as people type
 * it, with each one's published verdict per setting. 400 with field messages
 * for a bad query.
 */
export async function GET(request: NextRequest) {
  try {
    const params = request.nextUrl.searchParams;
    const input = SearchQuerySchema.parse({ q: params.get('q') ?? undefined, limit: params.get('limit') ?? undefined });
    const outcome = await searchFeedstocks(input.q, input.limit);
    // Only what a search box shows: name, other name that matched, category, published verdicts.
    const slim = (h: SearchHit) => ({ slug: h.slug, name: h.name, categoryLabel: h.categoryLabel, matchedAlias: h.matchedAlias, published: h.published });
    return NextResponse.json(
      { query: input.q, terms: outcome.terms, results: outcome.results.map(slim), suggestions: outcome.suggestions.map(slim) },
      // Results change only when feedstocks do; a short browser cache saves refetching while people retype.
      { headers: { 'Cache-Control': 'public, max-age=30' } },
    );
  } catch (err) {
    const { status, body } = toErrorResponse(err);
    return NextResponse.json(body, { status, headers: { 'Cache-Control': 'no-store' } });
  }
}
