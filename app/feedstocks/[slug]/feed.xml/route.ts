import { Feed } from 'feed';
import { NextResponse } from 'next/server';
import { listFeedstockFeedEntries, resolveFeedstockSlug } from '@/lib/queries/feedstocks';

/**
 * GET /feedstocks/[slug]/feed.xml — an Atom feed (RFC 4287) of one
 * feedstock's changes: verdict decisions, page edits, new trials. Old
 * addresses answer 308 to the current one.
 */
/** The feed library marks titles and summaries as HTML; our text is plain, so escape it. */
const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

export async function GET(_request: Request, { params }: { params: Promise<{ slug: string }> }) {
  const { slug } = await params;
  const resolved = await resolveFeedstockSlug(slug);
  const base = (process.env.AUTH_URL ?? 'http://localhost:3000').replace(/\/$/, '');
  if (resolved.kind === 'redirect') return NextResponse.redirect(`${base}/feedstocks/${resolved.slug}/feed.xml`, 308);
  if (resolved.kind === 'missing') return new NextResponse('No such feedstock.', { status: 404, headers: { 'Content-Type': 'text/plain; charset=utf-8' } });
  const data = await listFeedstockFeedEntries(resolved.id);
  if (!data) return new NextResponse('No such feedstock.', { status: 404, headers: { 'Content-Type': 'text/plain; charset=utf-8' } });
  const page = `${base}/feedstocks/${data.slug}`;
  const feed = new Feed({
    id: page,
    title: `${esc(data.name)} — Trialbed`,
    description: `Verdict decisions, page edits and new trials for ${esc(data.name.toLowerCase())}.`,
    link: page,
    language: 'en',
    updated: data.entries[0] ? new Date(data.entries[0].date) : new Date(0),
    feedLinks: { atom: `${page}/feed.xml` },
    author: { name: 'Trialbed', link: base },
    copyright: 'CC BY-SA 4.0',
    generator: false,
  });
  for (const e of data.entries) {
    feed.addItem({ id: `${base}/feedstocks/${data.slug}#${e.id}`, title: esc(e.title), link: `${base}${e.path}`, date: new Date(e.date), description: esc(e.summary) });
  }
  return new NextResponse(feed.atom1(), {
    headers: { 'Content-Type': 'application/atom+xml; charset=utf-8', 'Cache-Control': 'public, max-age=300' },
  });
}
