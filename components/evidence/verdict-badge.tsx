import type { ReactNode } from 'react';
import { cx } from '@/components/ui/class-names';
import { VERDICT_LABELS, type Verdict } from '@/lib/vocabulary';

/** Verdict codes (in the order pages list them), their type and labels: one list in lib/vocabulary.ts. */
export { VERDICTS, VERDICT_LABELS, type Verdict } from '@/lib/vocabulary';

/** Certainty grades (terms from the GRADE approach), strongest first. */
export const CERTAINTY_GRADES = ['high', 'moderate', 'low', 'very low'] as const;
export type CertaintyGrade = (typeof CERTAINTY_GRADES)[number];

export type BadgeSize = 'sm' | 'md' | 'lg';

const sizeClasses: Record<BadgeSize, { box: string; icon: number }> = {
  sm: { box: 'gap-1 px-2 py-0.5 text-sm', icon: 14 },
  md: { box: 'gap-1.5 px-2.5 py-1 text-base', icon: 16 },
  lg: { box: 'gap-2 px-3 py-1.5 text-lg', icon: 20 },
};

const verdictClasses: Record<Verdict, string> = {
  feed: 'bg-verdict-feed-soft text-verdict-feed border-verdict-feed/40',
  limit: 'bg-verdict-limit-soft text-verdict-limit border-verdict-limit/40',
  prepare: 'bg-verdict-prepare-soft text-verdict-prepare border-verdict-prepare/40',
  avoid: 'bg-verdict-avoid-soft text-verdict-avoid border-verdict-avoid/40',
  unsettled: 'bg-verdict-unsettled-soft text-verdict-unsettled border-verdict-unsettled/40 border-dashed',
};

function Svg({ size, children }: { size: number; children: ReactNode }) {
  return (
    <svg
      width={size}
      height={size}
      viewBox="0 0 16 16"
      fill="none"
      stroke="currentColor"
      strokeWidth={1.6}
      strokeLinecap="round"
      strokeLinejoin="round"
      aria-hidden="true"
      focusable="false"
      className="shrink-0"
    >
      {children}
    </svg>
  );
}

/*
 * One shape per verdict, so verdicts stay distinct in greyscale and for
 * colour-blind readers:
 *   feed      — a two-leaf sprout (things grow)
 *   limit     — a tall tub with only a shallow fill (a little at a time)
 *   prepare   — an hourglass (soak, age or pre-compost first)
 *   avoid     — a diamond with a cross (closed gate)
 *   unsettled — a broken ring around a question mark (open question)
 */
const icons: Record<Verdict, (size: number) => ReactNode> = {
  feed: (s) => (
    <Svg size={s}>
      <path d="M8 14.5V7.5" />
      <path d="M8 9.5C5 9.5 2.5 7.8 2.5 4.5 5.5 4.5 8 6.2 8 9.5Z" fill="currentColor" />
      <path d="M8 7.5c0-3.3 2.2-5.5 5.5-5.5 0 3.3-2.2 5.5-5.5 5.5Z" fill="currentColor" />
    </Svg>
  ),
  limit: (s) => (
    <Svg size={s}>
      <path d="M3 2.5v9.5a2 2 0 0 0 2 2h6a2 2 0 0 0 2-2V2.5" />
      <rect x="5" y="10" width="6" height="2" rx="0.5" fill="currentColor" stroke="none" />
      <path d="M3 6.5h1.5M11.5 6.5H13" />
    </Svg>
  ),
  prepare: (s) => (
    <Svg size={s}>
      <path d="M3.5 1.75h9M3.5 14.25h9" />
      <path d="M4.75 1.75c0 3.25 6.5 3.25 6.5 6.25s-6.5 3-6.5 6.25M11.25 1.75c0 3.25-6.5 3.25-6.5 6.25s6.5 3 6.5 6.25" />
      <path d="M6.5 12.75h3L8 11.25Z" fill="currentColor" />
    </Svg>
  ),
  avoid: (s) => (
    <Svg size={s}>
      <path d="M8 1.25 14.75 8 8 14.75 1.25 8Z" />
      <path d="m5.9 5.9 4.2 4.2M10.1 5.9l-4.2 4.2" />
    </Svg>
  ),
  unsettled: (s) => (
    <Svg size={s}>
      <circle cx="8" cy="8" r="6.5" strokeDasharray="2.4 1.9" />
      <path d="M6.3 6.3a1.8 1.8 0 1 1 2.5 1.65c-.5.2-.8.6-.8 1.1v.55" />
      <circle cx="8" cy="11.5" r="0.55" fill="currentColor" />
    </Svg>
  ),
};

/** The verdict's icon alone (decorative: always put the label next to it). */
export function VerdictIcon({ verdict, size = 16 }: { verdict: Verdict; size?: number }) {
  return <>{icons[verdict](size)}</>;
}

export type VerdictBadgeProps = {
  verdict: Verdict;
  size?: BadgeSize;
  className?: string;
};

/** A verdict as icon + label. Server-safe: no state, no effects. */
export function VerdictBadge({ verdict, size = 'md', className }: VerdictBadgeProps) {
  const s = sizeClasses[size];
  return (
    <span
      className={cx(
        'inline-flex items-center rounded-md border font-semibold leading-tight whitespace-nowrap',
        s.box,
        verdictClasses[verdict],
        className,
      )}
      data-verdict={verdict}
    >
      {icons[verdict](s.icon)}
      <span>{VERDICT_LABELS[verdict]}</span>
    </span>
  );
}

const certaintyLevel: Record<CertaintyGrade, number> = {
  high: 4,
  moderate: 3,
  low: 2,
  'very low': 1,
};

export type CertaintyBadgeProps = {
  grade: CertaintyGrade;
  size?: Exclude<BadgeSize, 'lg'>;
  className?: string;
};

/** "Certainty: moderate", with a four-step meter as decoration. */
export function CertaintyBadge({ grade, size = 'md', className }: CertaintyBadgeProps) {
  const level = certaintyLevel[grade];
  return (
    <span
      className={cx(
        'inline-flex items-center gap-1.5 rounded-md border border-line-strong bg-surface-raised font-semibold leading-tight text-ink whitespace-nowrap',
        size === 'sm' ? 'px-2 py-0.5 text-sm' : 'px-2.5 py-1 text-base',
        className,
      )}
      data-certainty={grade}
    >
      <svg
        width={size === 'sm' ? 14 : 16}
        height={size === 'sm' ? 14 : 16}
        viewBox="0 0 16 16"
        aria-hidden="true"
        focusable="false"
        className="shrink-0"
      >
        {[0, 1, 2, 3].map((i) => (
          <rect
            key={i}
            x={1 + i * 3.75}
            y={11 - i * 3}
            width="2.75"
            height={4 + i * 3}
            rx="0.6"
            fill={i < level ? 'currentColor' : 'none'}
            stroke="currentColor"
            strokeWidth="1"
          />
        ))}
      </svg>
      <span>Certainty: {grade}</span>
    </span>
  );
}
