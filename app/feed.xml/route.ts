import { getEnv } from '@/lib/env';
import { ATOM_CONTENT_TYPE, renderAtomFeed } from '@/lib/feeds/atom';
import { getFeed } from '@/lib/queries/feeds';

export const dynamic = 'force-dynamic';

/** GET /feed.xml — the site's Atom feed (RFC 4287): decisions, proposals, trials and page edits of every feedstock. */
export async function GET() {
  const xml = renderAtomFeed(await getFeed(null), getEnv().AUTH_URL);
  return new Response(xml, { headers: { 'Content-Type': ATOM_CONTENT_TYPE, 'Cache-Control': 'public, max-age=300' } });
}
