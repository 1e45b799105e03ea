import { NextResponse } from 'next/server';
import { getEnv } from '@/lib/env';
import { ATOM_CONTENT_TYPE, renderAtomFeed } from '@/lib/feeds/atom';
import { getFeed, resolveFeedFeedstock } from '@/lib/queries/feeds';

export const dynamic = 'force-dynamic';

/**
 * GET /feedstocks/[slug]/feed.xml — one feedstock's Atom feed (RFC 4287):
 * verdict decisions, proposals opened, trials linked and page edits. An old
 * or merged slug answers 308 to the current feed; an unknown one 404.
 */
export async function GET(_req: Request, ctx: { params: Promise<{ slug: string }> }) {
  const slug = (await ctx.params).slug;
  const base = getEnv().AUTH_URL.replace(/\/$/, '');
  const found = /^[a-z0-9-]{1,120}$/.test(slug) ? await resolveFeedFeedstock(slug) : null;
  if (!found) return new NextResponse('No such feedstock.', { status: 404, headers: { 'Content-Type': 'text/plain; charset=utf-8' } });
  if ('redirectTo' in found) return NextResponse.redirect(`${base}/feedstocks/${found.redirectTo}/feed.xml`, 308);
  const xml = renderAtomFeed(await getFeed(found.id), base);
  return new Response(xml, { headers: { 'Content-Type': ATOM_CONTENT_TYPE, 'Cache-Control': 'public, max-age=300' } });
}
