import type { Metadata } from 'next';
import Link from 'next/link';
import { DiffView } from '@/components/feedstock/diff-view';
import { RevertForm } from '@/components/feedstock/revert-form';
import { SubpageBreadcrumb } from '@/components/feedstock/subpage-breadcrumb';
import { getActor } from '@/lib/auth/actor';
import { loadEditableFeedstock } from '@/lib/feedstocks/editable-page';
import { formatDate } from '@/lib/format';
import { can } from '@/lib/policies';
import { listRevisionHistory } from '@/lib/queries/feedstocks';

export const dynamic = 'force-dynamic';

type Props = { params: Promise<{ slug: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const f = await loadEditableFeedstock((await params).slug, 'history');
  return { title: `History: ${f.name}`, description: `Every version of the page text about ${f.name.toLowerCase()}, with what changed.` };
}

export default async function HistoryPage({ params }: Props) {
  const { slug } = await params;
  const f = await loadEditableFeedstock(slug, 'history');
  const [history, actor] = await Promise.all([listRevisionHistory(f.id), getActor()]);
  const canRevert = can(actor, 'feedstock.edit');
  const canReview = can(actor, 'feedstock.review-edit');
  return (
    <div className="space-y-6">
      <SubpageBreadcrumb feedstock={f} current="History" />
      <h1 className="text-3xl">History of the page about {f.name.toLowerCase()}</h1>
      <p className="max-w-prose">
        {history.entries.length} published {history.entries.length === 1 ? 'version' : 'versions'}, newest first. A revert never deletes anything:
        it publishes the old text again as a new version.
        {history.pending ? (
          <>
            {' '}
            {history.pending} suggested {history.pending === 1 ? 'edit is' : 'edits are'} waiting for review
            {canReview ? (
              <>
                {' '}
                (<Link href="/review/edits">review queue</Link>)
              </>
            ) : null}
            .
          </>
        ) : null}
      </p>
      <ol className="list-none space-y-6 p-0">
        {history.entries.map((e, i) => (
          <li key={e.id} className="space-y-3 rounded-lg border border-line bg-surface-raised p-4">
            <h2 className="text-xl">
              Version {e.version}
              {/* A space, so the heading reads "Version 2 current", not "Version 2current". */}
              {e.isCurrent ? ' ' : null}
              {e.isCurrent ? <span className="ml-2 rounded-full bg-accent-soft px-2 py-0.5 font-sans text-sm font-semibold text-accent-strong">current</span> : null}
            </h2>
            <p>
              {e.editSummary ? <>“{e.editSummary}” — </> : null}
              {e.authorName ?? 'a former member'}
              {e.reviewerName && e.reviewerName !== e.authorName ? `, approved by ${e.reviewerName}` : ''},{' '}
              <time dateTime={e.publishedAt ?? e.createdAt}>{formatDate(e.publishedAt ?? e.createdAt)}</time>.{' '}
              <span className="text-ink-muted">
                {e.added} {e.added === 1 ? 'line' : 'lines'} added, {e.removed} removed.
              </span>
            </p>
            {i < 3 ? (
              <DiffView parts={e.diff} label={`Changes in version ${e.version}`} />
            ) : (
              <details>
                <summary className="cursor-pointer font-semibold">Show the changes</summary>
                <div className="mt-2">
                  <DiffView parts={e.diff} label={`Changes in version ${e.version}`} />
                </div>
              </details>
            )}
            {canRevert && !e.isCurrent ? <RevertForm feedstockId={f.id} revisionId={e.id} version={e.version} baseVersion={f.version} /> : null}
          </li>
        ))}
      </ol>
    </div>
  );
}
