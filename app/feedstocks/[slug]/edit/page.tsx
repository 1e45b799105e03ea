import type { Metadata } from 'next';
import { PageEditForm } from '@/components/feedstock/page-edit-form';
import { PageText } from '@/components/markdown/page-text';
import { LinkButton } from '@/components/ui/link-button';
import { SubpageBreadcrumb } from '@/components/feedstock/subpage-breadcrumb';
import { getActor } from '@/lib/auth/actor';
import { loadEditableFeedstock } from '@/lib/feedstocks/editable-page';
import { can } from '@/lib/policies';

export const dynamic = 'force-dynamic';

type Props = { params: Promise<{ slug: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const f = await loadEditableFeedstock((await params).slug, 'edit');
  return { title: `Edit: ${f.name}`, description: `Edit the page text about ${f.name.toLowerCase()}.`, robots: { index: false } };
}

export default async function EditPage({ params }: Props) {
  const { slug } = await params;
  const [f, actor] = await Promise.all([loadEditableFeedstock(slug, 'edit'), getActor()]);
  const canEdit = can(actor, 'feedstock.edit');
  const canSuggest = can(actor, 'feedstock.suggest-edit');
  return (
    <div className="space-y-6">
      <SubpageBreadcrumb feedstock={f} current="Edit" />
      <h1 className="text-3xl">{canEdit ? 'Edit' : canSuggest ? 'Suggest an edit to' : 'Edit'} the page about {f.name.toLowerCase()}</h1>
      {canSuggest ? (
        <PageEditForm feedstockId={f.id} initialText={f.pageText} baseVersion={f.version} mode={canEdit ? 'publish' : 'suggest'} />
      ) : (
        <div className="space-y-4">
          <section aria-labelledby="signin-heading" className="max-w-prose space-y-3 rounded-lg border border-line bg-surface-raised p-4">
            <h2 id="signin-heading" className="text-xl">
              Sign in to edit
            </h2>
            <p>
              {actor
                ? 'Contributors can suggest edits and editors publish them. Accept the contributor licence on your account page to start suggesting.'
                : 'Contributors suggest edits, which an editor reviews; editors publish directly. Sign in to take part.'}
            </p>
            <LinkButton href={actor ? '/account' : `/signin?callbackUrl=${encodeURIComponent(`/feedstocks/${f.slug}/edit`)}`}>
              {actor ? 'Go to your account' : 'Sign in'}
            </LinkButton>
          </section>
          <section aria-labelledby="current-heading" className="space-y-2">
            <h2 id="current-heading" className="text-xl">
              The current text (version {f.version})
            </h2>
            <PageText source={f.pageText} />
          </section>
        </div>
      )}
    </div>
  );
}
