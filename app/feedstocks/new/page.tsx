import type { Metadata } from 'next';
import { AccessPage } from '@/components/layout/access-note';
import { CreateFeedstockForm } from '@/components/feedstock/manage-forms';
import { HANDLING_ADVICE, type HandlingCautionCode } from '@/components/feedstock/vocabulary';
import { CATEGORIES, CATEGORY_LABELS } from '@/components/layout/vocabulary';
import { getActor } from '@/lib/auth/actor';
import { can } from '@/lib/policies';

export const dynamic = 'force-dynamic';

export const metadata: Metadata = { title: 'New feedstock', robots: { index: false } };

export default async function NewFeedstockPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const [actor, sp] = await Promise.all([getActor(), searchParams]);
  const name = typeof sp.name === 'string' ? sp.name.slice(0, 160) : undefined;
  const requestId = typeof sp.requestId === 'string' && /^\d{1,9}$/.test(sp.requestId) ? Number(sp.requestId) : undefined;
  if (!can(actor, 'feedstock.create')) return <AccessPage title="New feedstock" actor={actor} who="editors" callbackUrl="/feedstocks/new" />;
  return (
    <div className="space-y-6">
      <h1 className="text-3xl">New feedstock</h1>
      <CreateFeedstockForm
        defaultName={name}
        requestId={requestId}
        categories={CATEGORIES.map((c) => ({ value: c, label: CATEGORY_LABELS[c] }))}
        cautions={(Object.keys(HANDLING_ADVICE) as HandlingCautionCode[]).map((c) => ({ value: c, label: HANDLING_ADVICE[c].title }))}
      />
    </div>
  );
}
