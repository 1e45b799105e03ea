import { VERDICTS, VerdictBadge } from '@/components/evidence/verdict-badge';
import { cx } from '@/components/ui/class-names';
import { VERDICT_DESCRIPTIONS } from './vocabulary';

/** The five verdicts, each badge with a one-line meaning. */
export function VerdictLegend({
  columns = 2,
  className,
}: {
  /** Columns from 640 px up; one column below. */
  columns?: 1 | 2;
  className?: string;
}) {
  return (
    <dl className={cx('grid gap-3', columns === 2 && 'sm:grid-cols-2', className)}>
      {VERDICTS.map((verdict) => (
        <div
          key={verdict}
          className="flex flex-col items-start gap-2 rounded-lg border border-line bg-surface-raised p-4"
        >
          <dt>
            <VerdictBadge verdict={verdict} />
          </dt>
          <dd className="m-0 text-ink">{VERDICT_DESCRIPTIONS[verdict]}</dd>
        </div>
      ))}
    </dl>
  );
}
