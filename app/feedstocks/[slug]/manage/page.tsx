import type { Metadata } from 'next';
import { AccessNote } from '@/components/layout/access-note';
import { MergeFeedstockForm, RenameFeedstockForm } from '@/components/feedstock/manage-forms';
import { SubpageBreadcrumb } from '@/components/feedstock/subpage-breadcrumb';
import { getActor } from '@/lib/auth/actor';
import { loadEditableFeedstock } from '@/lib/feedstocks/editable-page';
import { can } from '@/lib/policies';
import { listFeedstockChoices } from '@/lib/queries/feedstocks';

export const dynamic = 'force-dynamic';

export const metadata: Metadata = { title: 'Manage feedstock', robots: { index: false } };

export default async function ManagePage({ params }: { params: Promise<{ slug: string }> }) {
  const { slug } = await params;
  const [f, actor] = await Promise.all([loadEditableFeedstock(slug, 'manage'), getActor()]);
  const canRename = can(actor, 'feedstock.rename');
  const canMerge = can(actor, 'feedstock.merge');
  return (
    <div className="space-y-8">
      <SubpageBreadcrumb feedstock={f} current="Manage" />
      <h1 className="text-3xl">Manage {f.name.toLowerCase()}</h1>
      {!canRename && !canMerge ? <AccessNote actor={actor} who="editors" callbackUrl={`/feedstocks/${f.slug}/manage`} /> : null}
      <div className="grid max-w-4xl gap-8 md:grid-cols-2">
        {canRename ? <RenameFeedstockForm feedstockId={f.id} name={f.name} slug={f.slug} /> : null}
        {canMerge ? (
          <MergeFeedstockForm
            feedstockId={f.id}
            name={f.name}
            choices={(await listFeedstockChoices()).filter((c) => c.id !== f.id).map((c) => ({ value: String(c.id), label: c.name }))}
          />
        ) : null}
      </div>
    </div>
  );
}
