import { cx } from '@/components/ui/class-names';
import { OUTCOME_LABELS, STATUS_LABELS, type Outcome, type TrialStatus } from './vocabulary';

const tone: Record<Outcome, string> = {
  consumed: 'border-verdict-feed/50 bg-verdict-feed-soft text-verdict-feed',
  partial: 'border-verdict-limit/50 bg-verdict-limit-soft text-verdict-limit',
  rejected: 'border-verdict-unsettled/50 bg-verdict-unsettled-soft text-verdict-unsettled',
  harm: 'border-verdict-avoid/50 bg-verdict-avoid-soft text-verdict-avoid',
};

/** A trial outcome as words (colour only decorates). `null` reads "Not settled yet". */
export function OutcomeBadge({ outcome, className }: { outcome: Outcome | null; className?: string }) {
  return (
    <span
      data-outcome={outcome ?? 'none'}
      className={cx(
        'inline-flex items-center rounded-md border px-2 py-0.5 text-sm font-semibold whitespace-nowrap',
        outcome ? tone[outcome] : 'border-dashed border-line-strong text-ink-muted',
        className,
      )}
    >
      {outcome ? OUTCOME_LABELS[outcome] : 'Not settled yet'}
    </span>
  );
}

/** Running / closed / abandoned, as words. */
export function StatusBadge({ status }: { status: TrialStatus }) {
  return (
    <span data-status={status} className="inline-flex items-center rounded-md border border-line-strong px-2 py-0.5 text-sm font-semibold whitespace-nowrap text-ink">
      {STATUS_LABELS[status]}
    </span>
  );
}
