import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound, permanentRedirect } from 'next/navigation';
import { SubscribePanel } from '@/components/subscription/subscribe-panel';
import { getFeedstockToFollow } from '@/lib/queries/subscriptions';

export const dynamic = 'force-dynamic';

type Params = { params: Promise<{ slug: string }> };

export async function generateMetadata({ params }: Params): Promise<Metadata> {
  const f = await getFeedstockToFollow((await params).slug);
  if (!f || 'redirectTo' in f) return { title: 'Follow a feedstock' };
  return {
    title: `Follow ${f.name}`,
    alternates: { types: { 'application/atom+xml': [{ url: `/feedstocks/${f.slug}/feed.xml`, title: `${f.name} — Trialbed updates` }] } },
  };
}

/** Follow one feedstock by e-mail: the same panel the feedstock page embeds, on a page of its own. */
export default async function FollowFeedstockPage({ params }: Params) {
  const f = await getFeedstockToFollow((await params).slug);
  if (!f) notFound();
  if ('redirectTo' in f) permanentRedirect(`/feedstocks/${f.redirectTo}/subscribe`);
  return (
    <div className="mx-auto max-w-prose space-y-6">
      <header className="space-y-2">
        <p>
          <Link href={`/feedstocks/${f.slug}`} className="underline underline-offset-4">
            ← {f.name}
          </Link>
        </p>
        <h1 className="text-4xl">Keep up with {f.name}</h1>
        <p>By e-mail — each change as it happens, or a weekly digest — or in a feed reader.</p>
      </header>
      <SubscribePanel feedstockId={f.id} feedstockSlug={f.slug} feedstockName={f.name} />
    </div>
  );
}
