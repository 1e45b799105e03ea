import type { Metadata } from 'next';
import Link from 'next/link';
import { z } from 'zod';
import { AccessPage } from '@/components/layout/access-note';
import { DiffView } from '@/components/feedstock/diff-view';
import { ReviewEditForm } from '@/components/feedstock/review-forms';
import { getActor } from '@/lib/auth/actor';
import { formatDate } from '@/lib/format';
import { can } from '@/lib/policies';
import { getDecidedEdit, listPendingEdits } from '@/lib/queries/feedstocks';

export const dynamic = 'force-dynamic';

export const metadata: Metadata = { title: 'Suggested edits', description: 'Page-text edits waiting for an editor.', robots: { index: false } };

/** `?decided=<id>`: the edit just approved or rejected (set by reviewEditAction). */
const DecidedParam = z.coerce.number().int().positive();

export default async function ReviewEditsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const actor = await getActor();
  if (!can(actor, 'feedstock.review-edit')) {
    return <AccessPage title="Suggested edits" actor={actor} who="editors" callbackUrl="/review/edits" />;
  }
  const decidedId = DecidedParam.safeParse((await searchParams).decided);
  const [edits, decided] = await Promise.all([listPendingEdits(), decidedId.success ? getDecidedEdit(decidedId.data) : null]);
  return (
    <div className="space-y-6">
      <h1 className="text-3xl">Suggested edits</h1>
      {decided ? (
        <p role="status" className="max-w-prose rounded-md border-2 border-verdict-feed bg-verdict-feed-soft p-3 text-ink">
          {decided.status === 'published' ? 'Published the edit to ' : 'Rejected the edit to '}
          <Link href={`/feedstocks/${decided.feedstockSlug}`}>{decided.feedstockName}</Link>
          {decided.status === 'published' ? ` as version ${decided.version}.` : '; its author has been told why.'}
        </p>
      ) : null}
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
