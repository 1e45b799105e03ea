import Link from 'next/link';
import type { ComponentProps, ReactNode } from 'react';
import { DEFER_TO_LOCAL_RULES } from '@/components/layout/safety-note';
import { VerdictBadge, type Verdict } from '@/components/evidence/verdict-badge';
import {
  AVOID_MAX_ACCEPTED_SHARE,
  AVOID_MIN_HARM_SHARE,
  CEILING_SUCCESS_THRESHOLD,
  CONSUMED_MAX_REMAINING_PCT,
  CONSUMPTION_WINDOW_DAYS,
  FEED_MAX_HARM_SHARE,
  FEED_MIN_SUCCESS_LOWER,
  HEATING_FLAG_C,
  IMPRECISION_MAX_WIDTH,
  IMPRECISION_MIN_TRIALS,
  LETHAL_HEAT_C,
  MIN_CONTRIBUTORS,
  MIN_CONTROL_SHARE,
  MIN_FINISHED_TRIALS,
  MIN_PHOTO_SHARE,
  ORDINARY_LOAD_KGM2,
  WILSON_Z,
} from '@/lib/evidence/thresholds';

/*
 * Components available inside guides (content/guides/*.mdx). Rule values come
 * straight from the engine's thresholds, so a guide never disagrees with the
 * verdicts it explains.
 */

const pct = (x: number) => `${Math.round(x * 1000) / 10}%`;

/** The engine's rule values, by name, as text. */
export const RULE_VALUES: Record<string, string> = {
  MIN_FINISHED_TRIALS: String(MIN_FINISHED_TRIALS),
  MIN_CONTRIBUTORS: String(MIN_CONTRIBUTORS),
  CEILING_SUCCESS_THRESHOLD: pct(CEILING_SUCCESS_THRESHOLD),
  ORDINARY_LOAD_KGM2: `${ORDINARY_LOAD_KGM2} kg/m²`,
  FEED_MIN_SUCCESS_LOWER: pct(FEED_MIN_SUCCESS_LOWER),
  FEED_MAX_HARM_SHARE: pct(FEED_MAX_HARM_SHARE),
  AVOID_MIN_HARM_SHARE: pct(AVOID_MIN_HARM_SHARE),
  AVOID_MAX_ACCEPTED_SHARE: pct(AVOID_MAX_ACCEPTED_SHARE),
  CONSUMED_MAX_REMAINING_PCT: `${CONSUMED_MAX_REMAINING_PCT}%`,
  CONSUMPTION_WINDOW_DAYS: `${CONSUMPTION_WINDOW_DAYS} days`,
  HEATING_FLAG_C: `${HEATING_FLAG_C} °C`,
  LETHAL_HEAT_C: `${LETHAL_HEAT_C} °C`,
  WILSON_Z: String(WILSON_Z),
  MIN_CONTROL_SHARE: pct(MIN_CONTROL_SHARE),
  MIN_PHOTO_SHARE: pct(MIN_PHOTO_SHARE),
  IMPRECISION_MIN_TRIALS: String(IMPRECISION_MIN_TRIALS),
  IMPRECISION_MAX_WIDTH: String(IMPRECISION_MAX_WIDTH),
};

/** One rule value inline: <Rule name="MIN_FINISHED_TRIALS" />. */
function Rule({ name }: { name: string }) {
  return <strong>{RULE_VALUES[name] ?? '?'}</strong>;
}

/** A boxed note; `tone="caution"` for safety. */
function Note({ children, tone = 'info', title }: { children: ReactNode; tone?: 'info' | 'caution'; title?: string }) {
  return (
    <aside
      className={
        tone === 'caution'
          ? 'my-4 rounded-lg border-2 border-verdict-avoid/50 bg-surface-raised p-4'
          : 'my-4 rounded-lg border border-line bg-surface-raised p-4'
      }
    >
      {title ? <p className="mb-1 font-semibold">{title}</p> : null}
      <div className="space-y-2 [&>p]:m-0">{children}</div>
    </aside>
  );
}

/** The site's standard deferral to local regulations and licensed advice. */
function LocalRules() {
  return <p className="font-semibold">{DEFER_TO_LOCAL_RULES}</p>;
}

/** A verdict badge inside prose. */
function Verdict({ code }: { code: Verdict }) {
  return <VerdictBadge verdict={code} size="sm" />;
}

function A({ href = '', children, ...rest }: ComponentProps<'a'>) {
  if (href.startsWith('/')) return <Link href={href}>{children}</Link>;
  return (
    <a href={href} rel="noopener noreferrer" {...rest}>
      {children}
    </a>
  );
}

/** Guides start at ##; a stray # becomes h2 so the page keeps one h1. */
export const guideComponents = {
  a: A,
  h1: (p: ComponentProps<'h2'>) => <h2 {...p} />,
  Rule,
  Note,
  LocalRules,
  Verdict,
};
