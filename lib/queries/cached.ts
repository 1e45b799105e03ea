import 'server-only';
import { unstable_cache } from 'next/cache';
import { FEEDSTOCKS_TAG, feedstockTag } from '@/lib/cache-tags';
import { loadFeedstockPage, type FeedstockPageDTO } from './feedstocks';

/**
 * Reads kept in the Next.js data cache, tagged so writers can drop them
 * (lib/cache-tags.ts). Only for use inside the Next.js server (pages, route
 * handlers); tests and scripts call the uncached queries.
 */

/** Seconds a cached read may live even if no writer revalidates its tag (a safety net). */
export const CACHE_SAFETY_SECONDS = 60;

/**
 * The feedstock page data, cached under `feedstock:<id>` and `feedstocks`.
 * `stamp` (from the slug lookup: the row's creation and change times and
 * versions) is part of the key, so a cache kept on disk from another database
 * or an older row can never be served for this one.
 */
export function getFeedstockPageCached(id: number, stamp: string): Promise<FeedstockPageDTO | null> {
  return unstable_cache(() => loadFeedstockPage(id), ['feedstock-page', String(id), stamp], {
    tags: [feedstockTag(id), FEEDSTOCKS_TAG],
    revalidate: CACHE_SAFETY_SECONDS,
  })();
}
