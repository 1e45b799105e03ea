import Link from 'next/link';
import { Badge } from '@/components/ui';
import type { SubscriptionDTO } from '@/lib/queries/subscriptions';
import { MODE_LABELS } from './mode-choice';
import { SubscriptionControls } from './subscription-controls';

const dateFormat = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });

/** The account page's list: what you follow, how often, and buttons to change or stop each. */
export function SubscriptionList({ subscriptions }: { subscriptions: SubscriptionDTO[] }) {
  if (!subscriptions.length) {
    return (
      <p>
        You follow nothing yet. Open a feedstock and choose <strong>Follow by e-mail</strong> (or{' '}
        <Link href="/subscribe">follow every feedstock</Link>): you get an e-mail — straight away or in a weekly digest — when its
        verdict is decided, a trial is linked, a proposal opens or its page is edited.
      </p>
    );
  }
  return (
    <ul className="m-0 list-none space-y-3 p-0">
      {subscriptions.map((s) => (
        <li key={s.id} className="space-y-2 rounded-md border border-line p-3">
          <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
            <span className="text-lg font-semibold">
              {s.slug ? <Link href={`/feedstocks/${s.slug}`}>{s.name}</Link> : s.feedstockId === null ? 'Every feedstock (the whole site)' : s.name}
            </span>
            {s.confirmed ? null : <Badge tone="outline">Waiting for the confirmation link</Badge>}
          </div>
          <p className="text-sm text-ink-muted">
            {MODE_LABELS[s.mode]} · since {dateFormat.format(new Date(s.since))}
          </p>
          <SubscriptionControls id={s.id} name={s.feedstockId === null ? 'every feedstock' : s.name} mode={s.mode} />
        </li>
      ))}
    </ul>
  );
}
