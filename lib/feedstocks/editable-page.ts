import 'server-only';
import { notFound, permanentRedirect } from 'next/navigation';
import { getEditableText, resolveFeedstockSlug } from '@/lib/queries/feedstocks';

/** The pages under /feedstocks/[slug]/ that work on a feedstock's page text and name. */
export type EditableSubpage = 'edit' | 'history' | 'manage';

/**
 * The feedstock behind `/feedstocks/<slug>/<subpage>`, for that page to render.
 * An old or merged slug answers 308 to the same subpage of the current
 * feedstock (`permanentRedirect`); an unknown one answers 404 (`notFound`).
 * Both throw, as Next.js expects, so the caller only sees a found feedstock.
 */
export async function loadEditableFeedstock(slug: string, subpage: EditableSubpage) {
  const resolved = await resolveFeedstockSlug(slug);
  if (resolved.kind === 'redirect') permanentRedirect(`/feedstocks/${resolved.slug}/${subpage}`);
  if (resolved.kind === 'missing') notFound();
  const f = await getEditableText(resolved.id);
  if (!f) notFound();
  return f;
}
