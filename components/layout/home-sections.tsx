import Link from 'next/link';
import { VERDICT_LABELS, VerdictBadge, type Verdict } from '@/components/evidence/verdict-badge';
import { cx } from '@/components/ui/class-names';
import { SETTING_LABELS, type Setting } from './vocabulary';

/*
 * Presentational slots for the home page. They take plain arrays (DTOs from
 * lib/queries) and render an honest empty state; they never invent entries.
 */

/** One decided verdict proposal. */
export type RecentDecision = {
  proposalId: number | string;
  feedstockName: string;
  feedstockSlug: string;
  setting: Setting;
  /** Published verdict before the decision; null for a first verdict. */
  from: Verdict | null;
  to: Verdict;
  /** ISO 8601 timestamp with offset. */
  decidedAt: string;
};

/** One trial whose next check-in is due. */
export type TrialNeedingCheckIn = {
  trialId: number | string;
  /** Short title, e.g. the feedstock and dose. */
  title: string;
  feedstockName: string;
  setting: Setting;
  /** ISO 8601 timestamp with offset. */
  dueAt: string;
};

function formatDate(iso: string): string {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  return new Intl.DateTimeFormat('en-GB', {
    day: 'numeric',
    month: 'short',
    year: 'numeric',
    // Same output on every server, whatever its local zone.
    timeZone: 'UTC',
  }).format(date);
}

type SectionProps = { className?: string; headingId?: string };

export function RecentDecisions({
  decisions,
  className,
  headingId = 'recent-decisions',
}: SectionProps & { decisions: readonly RecentDecision[] }) {
  return (
    <section aria-labelledby={headingId} className={cx('space-y-3', className)}>
      <h2 id={headingId} className="text-2xl">
        Recent verdict decisions
      </h2>
      {decisions.length === 0 ? (
        <p className="text-ink-muted">No decisions yet.</p>
      ) : (
        <ul className="m-0 list-none space-y-2 p-0">
          {decisions.map((d) => (
            <li
              key={d.proposalId}
              className="flex flex-wrap items-center gap-x-3 gap-y-2 rounded-lg border border-line bg-surface-raised p-3"
            >
              <Link href={`/feedstocks/${d.feedstockSlug}`} className="font-semibold">
                {d.feedstockName}
              </Link>
              <span className="text-ink-muted">{SETTING_LABELS[d.setting]}</span>
              <span className="flex flex-wrap items-center gap-2">
                {d.from ? (
                  <>
                    <span className="sr-only">changed from</span>
                    <VerdictBadge verdict={d.from} size="sm" />
                    <span aria-hidden="true">→</span>
                    <span className="sr-only">to</span>
                  </>
                ) : (
                  <span className="sr-only">first verdict:</span>
                )}
                <VerdictBadge verdict={d.to} size="sm" />
              </span>
              <span className="text-sm text-ink-muted">
                <Link href={`/proposals/${d.proposalId}`}>
                  Proposal {d.proposalId}
                  <span className="sr-only">
                    {' '}
                    ({d.from ? `${VERDICT_LABELS[d.from]} to ` : ''}
                    {VERDICT_LABELS[d.to]})
                  </span>
                </Link>
                , <time dateTime={d.decidedAt}>{formatDate(d.decidedAt)}</time>
              </span>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}

export function TrialsNeedingCheckIns({
  trials,
  className,
  headingId = 'trials-needing-check-ins',
}: SectionProps & { trials: readonly TrialNeedingCheckIn[] }) {
  return (
    <section aria-labelledby={headingId} className={cx('space-y-3', className)}>
      <h2 id={headingId} className="text-2xl">
        Trials needing check-ins
      </h2>
      {trials.length === 0 ? (
        <p className="text-ink-muted">No trials are waiting for a check-in.</p>
      ) : (
        <ul className="m-0 list-none space-y-2 p-0">
          {trials.map((t) => (
            <li
              key={t.trialId}
              className="flex flex-wrap items-baseline gap-x-3 gap-y-1 rounded-lg border border-line bg-surface-raised p-3"
            >
              <Link href={`/trials/${t.trialId}`} className="font-semibold">
                {t.title}
              </Link>
              <span className="text-ink-muted">
                {t.feedstockName} · {SETTING_LABELS[t.setting]}
              </span>
              <span className="text-sm text-ink-muted">
                Check-in due <time dateTime={t.dueAt}>{formatDate(t.dueAt)}</time>
              </span>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
