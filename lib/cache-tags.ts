/**
 * Next.js data-cache tags. Reads cached with a tag are dropped when a writer
 * revalidates it: after any change to a feedstock (text, name, slug, merge,
 * trials, evidence, published verdict) call `revalidateTag(feedstockTag(id))`
 * (or `updateTag` inside a server action) and `revalidateTag(FEEDSTOCKS_TAG)`.
 */

/** Everything cached about one feedstock (its page data, feed, history). */
export function feedstockTag(id: number): string {
  return `feedstock:${id}`;
}

/** Lists that span feedstocks: the index, related feedstocks, slug lookups, the sitemap. */
export const FEEDSTOCKS_TAG = 'feedstocks';
