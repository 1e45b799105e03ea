import type { Metadata } from 'next';
import Link from 'next/link';
import { getActor } from '@/lib/auth/actor';
import { getReviewQueue, type ReviewItem } from '@/lib/queries/proposals';
import { can } from '@/lib/policies';

export const dynamic = 'force-dynamic';

export const metadata: Metadata = {
  title: 'Review queue',
  description: 'Proposals ready for a decision, evidence that disagrees with published verdicts, pending edits and requests.',
};

const SECTIONS: { kind: ReviewItem['kind']; title: string; empty: string }[] = [
  { kind: 'ready-proposal', title: 'Ready for a decision', empty: 'No proposal has reached consensus yet.' },
  { kind: 'open-proposal', title: 'Open proposals', empty: 'No other open proposals.' },
  { kind: 'mismatch', title: 'Evidence disagrees with the published verdict', empty: 'Every settled evidence verdict matches its published verdict.' },
  { kind: 'pending-edit', title: 'Page edits waiting for review', empty: 'No page edits are waiting.' },
  { kind: 'request', title: 'Requested feedstocks', empty: 'No open requests.' },
];

export default async function ReviewPage() {
  const actor = await getActor();
  if (!can(actor, 'review.view')) {
    return (
      <div className="space-y-3">
        <h1 className="text-3xl">Review queue</h1>
        <p>{actor ? 'The review queue is for editors and moderators.' : <><Link href="/signin" className="underline">Sign in</Link> as an editor or moderator to review.</>}</p>
      </div>
    );
  }
  const queue = await getReviewQueue();
  return (
    <div className="space-y-8">
      <header className="space-y-2">
        <h1 className="text-3xl">Review queue</h1>
        <p className="text-ink-muted">
          {queue.waiting.count} item{queue.waiting.count === 1 ? '' : 's'} waiting
          {queue.waiting.count ? ` · oldest ${queue.waiting.oldestDays} days · median ${queue.waiting.medianDays} days` : ''}. Claim a proposal before deciding so nobody else decides it at the same time.
        </p>
      </header>
      {SECTIONS.map((s) => {
        const items = queue.items.filter((i) => i.kind === s.kind);
        return (
          <section key={s.kind} id={s.kind === 'request' ? 'requests' : s.kind} aria-labelledby={`${s.kind}-heading`} className="space-y-2">
            <h2 id={`${s.kind}-heading`} className="text-2xl">
              {s.title} ({items.length})
            </h2>
            {items.length ? (
              <ul className="space-y-2">
                {items.map((i) => (
                  <li key={i.id} className="rounded-md border border-line bg-surface-raised p-3">
                    <Link href={i.href} className="font-semibold underline underline-offset-4">
                      {i.title}
                    </Link>
                    <p className="text-sm">{i.detail}</p>
                    <p className="text-sm text-ink-muted">Waiting {i.waitingDays} day{i.waitingDays === 1 ? '' : 's'}</p>
                  </li>
                ))}
              </ul>
            ) : (
              <p className="text-ink-muted">{s.empty}</p>
            )}
          </section>
        );
      })}
    </div>
  );
}
