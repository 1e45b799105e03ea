import type { HTMLAttributes } from 'react';
import { cx } from './class-names';

export type BadgeTone = 'neutral' | 'accent' | 'outline';

const tones: Record<BadgeTone, string> = {
  neutral: 'bg-surface-sunken text-ink',
  accent: 'bg-accent-soft text-accent-strong',
  outline: 'border border-line-strong text-ink-muted',
};

export type BadgeProps = HTMLAttributes<HTMLSpanElement> & { tone?: BadgeTone };

/** A small inline label. Carries text; colour is decoration. */
export function Badge({ tone = 'neutral', className, ...rest }: BadgeProps) {
  return (
    <span
      className={cx(
        'inline-flex items-center gap-1 rounded-full px-2.5 py-0.5 text-sm font-semibold leading-6',
        tones[tone],
        className,
      )}
      {...rest}
    />
  );
}
