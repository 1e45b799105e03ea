import { Feed } from 'feed';
import type { FeedDTO } from '@/lib/queries/feeds';

/** The media type of our feeds (RFC 4287 §7). */
export const ATOM_CONTENT_TYPE = 'application/atom+xml; charset=utf-8';

/** The `feed` package marks titles and summaries as HTML; our text is plain, so it is escaped once here. */
const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

/**
 * Renders a feed as Atom 1.0 (RFC 4287) with the `feed` package: one id,
 * title and updated per feed and per entry, a feed-level author (so entries
 * need none), a rel="self" link, and an alternate link on every entry.
 * `baseUrl` is the public address (AUTH_URL): Atom wants absolute IRIs.
 * An empty feed takes `fallbackUpdated` as its updated time.
 */
export function renderAtomFeed(data: FeedDTO, baseUrl: string, fallbackUpdated: Date = new Date(0)): string {
  const base = baseUrl.replace(/\/$/, '');
  const page = data.feedstock ? `${base}/feedstocks/${encodeURIComponent(data.feedstock.slug)}` : base;
  const self = data.feedstock ? `${page}/feed.xml` : `${base}/feed.xml`;
  const feed = new Feed({
    id: self,
    title: esc(data.feedstock ? `${data.feedstock.name} — Trialbed updates` : 'Trialbed — updates on every feedstock'),
    description: esc(
      data.feedstock
        ? `Verdict decisions, proposals, new feeding trials and page edits for ${data.feedstock.name.toLowerCase()}.`
        : 'Verdict decisions, proposals, new feeding trials and page edits across Trialbed.',
    ),
    link: page,
    language: 'en',
    updated: data.updated ? new Date(data.updated) : fallbackUpdated,
    feedLinks: { atom: self },
    author: { name: 'Trialbed contributors', link: base },
    copyright: 'Text and data: CC BY-SA 4.0',
    generator: false,
  });
  for (const e of data.entries) {
    const link = `${base}${e.path}`;
    feed.addItem({
      id: `${link}#${e.key}`,
      title: esc(e.title),
      link,
      date: new Date(e.updated),
      description: esc(e.summary),
    });
  }
  return feed.atom1();
}
