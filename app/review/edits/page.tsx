import type { Metadata } from 'next';
import Link from 'next/link';
import { AccessPage } from '@/components/layout/access-note';
import { DiffView } from '@/components/feedstock/diff-view';
import { ReviewEditForm } from '@/components/feedstock/review-forms';
import { getActor } from '@/lib/auth/actor';
import { formatDate } from '@/lib/format';
import { can } from '@/lib/policies';
import { listPendingEdits } from '@/lib/queries/feedstocks';

export const dynamic = 'force-dynamic';

export const metadata: Metadata = { title: 'Suggested edits', description: 'Page-text edits waiting for an editor.', robots: { index: false } };

export default async function ReviewEditsPage() {
  const actor = await getActor();
  if (!can(actor, 'feedstock.review-edit')) {
    return <AccessPage title="Suggested edits" actor={actor} who="editors" callbackUrl="/review/edits" />;
  }
  const edits = await listPendingEdits();
  return (
    <div className="space-y-6">
      <h1 className="text-3xl">Suggested edits</h1>
      <p className="max-w-prose">
        {edits.length ? `${edits.length} ${edits.length === 1 ? 'edit is' : 'edits are'} waiting, oldest first.` : 'Nothing is waiting.'} Also:{' '}
        <Link href="/review/requests">requested feedstocks</Link>.
      </p>
      <ol className="list-none space-y-6 p-0">
        {edits.map((e) => (
          <li key={e.id} className="space-y-3 rounded-lg border border-line bg-surface-raised p-4">
            <h2 className="text-xl">
              <Link href={`/feedstocks/${e.feedstockSlug}`}>{e.feedstockName}</Link>
            </h2>
            <p>
              {e.editSummary ? <>“{e.editSummary}” — </> : null}
              {e.authorName ?? 'a former member'}, {formatDate(e.createdAt)}. Made against version {e.baseVersion}
              {e.stale ? <strong> (the page is now version {e.currentVersion})</strong> : null}. {e.added} lines added, {e.removed} removed
              compared with the current text.
            </p>
            <DiffView parts={e.diff} label={`Suggested changes to ${e.feedstockName}`} />
            <ReviewEditForm revisionId={e.id} stale={e.stale} />
          </li>
        ))}
      </ol>
    </div>
  );
}
