import type { MetadataRoute } from 'next';
import { listGuides } from '@/content/guides';
import { listFeedstockSlugs } from '@/lib/queries/feedstocks';

// Built per request: feedstocks come and go.
export const dynamic = 'force-dynamic';

/** Every public page worth indexing: home, lists, feedstock pages, guides, tools. */
export default async function sitemap(): Promise<MetadataRoute.Sitemap> {
  const base = (process.env.AUTH_URL ?? 'http://localhost:3000').replace(/\/$/, '');
  const [feedstocks, guides] = await Promise.all([listFeedstockSlugs(), listGuides()]);
  return [
    { url: `${base}/`, changeFrequency: 'daily', priority: 1 },
    { url: `${base}/feedstocks`, changeFrequency: 'daily', priority: 0.9 },
    ...feedstocks.map((f) => ({ url: `${base}/feedstocks/${f.slug}`, lastModified: f.updatedAt, changeFrequency: 'weekly' as const, priority: 0.8 })),
    { url: `${base}/guides`, changeFrequency: 'monthly', priority: 0.6 },
    ...guides.map((g) => ({ url: `${base}/guides/${g.slug}`, lastModified: g.updated, changeFrequency: 'monthly' as const, priority: 0.6 })),
    { url: `${base}/tools/mix`, changeFrequency: 'yearly', priority: 0.4 },
    { url: `${base}/tools/bin-size`, changeFrequency: 'yearly', priority: 0.4 },
    { url: `${base}/about`, changeFrequency: 'yearly', priority: 0.3 },
  ];
}
