import Link from 'next/link';
import { SETTING_LABELS } from '@/components/layout/vocabulary';
import { Table } from '@/components/ui/table';
import type { TrialListRow } from '@/lib/queries/trials';
import { OutcomeBadge, StatusBadge } from './outcome-badge';
import { formatDay, formatDose, formatNumber, PREPARATION_LABELS } from './vocabulary';

function loadText(r: TrialListRow): string {
  return `${formatDose(r.dose.amount, r.dose.unit)} on ${formatNumber(r.surfaceAreaM2)} m² (${formatNumber(r.surfaceLoadKgM2)} kg/m²)`;
}

/**
 * Trials as a table on wide screens and as cards on a phone (one of the two
 * is hidden, so assistive technology meets only one).
 */
export function TrialList({ rows, caption, showFeedstock = true }: { rows: readonly TrialListRow[]; caption: string; showFeedstock?: boolean }) {
  if (!rows.length) return <p className="text-ink-muted">No trials match.</p>;
  return (
    <>
      <div className="hidden md:block">
        <Table caption={caption} hideCaption>
          <thead>
            <tr>
              <th scope="col">Trial</th>
              {showFeedstock ? <th scope="col">Feedstock</th> : null}
              <th scope="col">Setting</th>
              <th scope="col">Dose</th>
              <th scope="col">Started</th>
              <th scope="col">Check-ins</th>
              <th scope="col">Status</th>
              <th scope="col">Outcome</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.id}>
                <th scope="row" className="border-t border-line">
                  <Link href={`/trials/${r.id}`}>Trial {r.id}</Link>
                  {r.isDemo ? <span className="ml-1 text-xs font-normal text-ink-muted">(demo)</span> : null}
                  <span className="block text-sm font-normal text-ink-muted">{PREPARATION_LABELS[r.preparation]}</span>
                </th>
                {showFeedstock ? (
                  <td>
                    <Link href={`/feedstocks/${r.feedstock.slug}`}>{r.feedstock.name}</Link>
                  </td>
                ) : null}
                <td>{SETTING_LABELS[r.setting]}</td>
                <td className="text-sm">{loadText(r)}</td>
                <td>
                  <time dateTime={r.startDate}>{formatDay(r.startDate)}</time>
                </td>
                <td>{r.checkInCount}</td>
                <td>
                  <StatusBadge status={r.status} />
                </td>
                <td>
                  <OutcomeBadge outcome={r.outcome} />
                </td>
              </tr>
            ))}
          </tbody>
        </Table>
      </div>
      <ul className="m-0 list-none space-y-3 p-0 md:hidden" aria-label={caption}>
        {rows.map((r) => (
          <li key={r.id} className="rounded-lg border border-line bg-surface-raised p-4">
            <p className="m-0 flex flex-wrap items-baseline gap-x-2">
              <Link href={`/trials/${r.id}`} className="font-semibold">
                Trial {r.id}
                {showFeedstock ? `: ${r.feedstock.name}` : ''}
              </Link>
              {r.isDemo ? <span className="text-xs text-ink-muted">(demo)</span> : null}
            </p>
            <p className="m-0 text-sm text-ink-muted">
              {PREPARATION_LABELS[r.preparation]} · {SETTING_LABELS[r.setting]} · started {formatDay(r.startDate)}
            </p>
            <p className="m-0 text-sm">{loadText(r)}</p>
            <p className="m-0 mt-2 flex flex-wrap items-center gap-2 text-sm">
              <StatusBadge status={r.status} />
              <OutcomeBadge outcome={r.outcome} />
              <span className="text-ink-muted">
                {r.checkInCount} check-in{r.checkInCount === 1 ? '' : 's'}
              </span>
            </p>
          </li>
        ))}
      </ul>
    </>
  );
}
