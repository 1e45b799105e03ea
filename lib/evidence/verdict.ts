/**
 * Verdict rules: settling, the group verdict (one setting × preparation) and
 * the setting verdict that combines preparation groups. Thresholds are in
 * thresholds.ts; every rule is monotone: more consumed trials can only raise
 * the consumed share, its Wilson lower bound and the ceiling and lower the harm
 * share, so a verdict can only improve, and the reverse for harm trials.
 */
import {
  AVOID_MAX_ACCEPTED_SHARE,
  AVOID_MIN_HARM_SHARE,
  BASELINE_PREPARATION,
  FEED_MAX_HARM_SHARE,
  FEED_MIN_SUCCESS_LOWER,
  GROUP_VERDICT_RANK,
  MIN_CONTRIBUTORS,
  MIN_FINISHED_TRIALS,
  ORDINARY_LOAD_KGM2,
  PREPARATION_ORDER,
  VERDICT_RANK,
} from './thresholds';
import type { GroupVerdict, Preparation, ThresholdCheck, Verdict } from './types';
import { formatLoad } from './units';
import { VERDICT_LABELS } from '../vocabulary';

const EPS = 1e-12;

/** Labels shown for verdict codes (one list for the whole product: lib/vocabulary.ts). */
export { VERDICT_LABELS };

/** Label of a verdict code. Throws RangeError on an unknown code. */
export function verdictLabel(v: Verdict): string {
  const l = VERDICT_LABELS[v];
  if (l === undefined) throw new RangeError(`unknown verdict ${String(v)}`);
  return l;
}

/**
 * Compares two verdicts in the order feed > limit > prepare > avoid:
 * positive when `a` is better, negative when worse, 0 when equal.
 * `unsettled` is not ranked: any comparison involving it returns `null`
 * (it is neither better nor worse; tests check separately that adding a
 * finished trial never turns a settled verdict into `unsettled`).
 * Throws RangeError on unknown codes.
 */
export function compareVerdicts(a: Verdict, b: Verdict): number | null {
  if (a === 'unsettled' || b === 'unsettled') {
    verdictLabel(a);
    verdictLabel(b);
    return null;
  }
  const ra = VERDICT_RANK[a];
  const rb = VERDICT_RANK[b];
  if (ra === undefined || rb === undefined) throw new RangeError('unknown verdict');
  return ra - rb;
}

/**
 * Settled when there are at least MIN_FINISHED_TRIALS finished trials from at
 * least MIN_CONTRIBUTORS distinct contributors. Both counts only grow as trials
 * are added, so a settled result never becomes unsettled.
 * Throws nothing.
 */
export function isSettled(finished: number, finishedContributors: number): boolean {
  return finished >= MIN_FINISHED_TRIALS && finishedContributors >= MIN_CONTRIBUTORS;
}

/** What the group rule reads. */
export interface GroupRuleInput {
  finished: number;
  consumed: number;
  partial: number;
  harm: number;
  /** Wilson lower bound of consumed / finished. */
  successLower: number | null;
  /** Dose ceiling, `null` when no tested load qualifies. */
  ceilingKgM2: number | null;
}

/** The group rule's decision with every threshold it compared. */
export interface GroupRuleResult {
  verdict: GroupVerdict | null;
  checks: ThresholdCheck[];
  /** Plain reason for the verdict. */
  because: string;
}

function pct(x: number): string {
  return `${Math.round(x * 100)}%`;
}

/**
 * Group verdict (one setting × preparation), regardless of settling:
 * - none without finished trials;
 * - `avoid` when no tested load reaches the ceiling threshold AND (harm share
 *   ≥ AVOID_MIN_HARM_SHARE OR accepted share (consumed + partial) < AVOID_MAX_ACCEPTED_SHARE);
 * - `feed` when the ceiling ≥ ORDINARY_LOAD_KGM2 AND the Wilson lower bound of
 *   the consumed share ≥ FEED_MIN_SUCCESS_LOWER AND harm share ≤ FEED_MAX_HARM_SHARE;
 * - `limit` otherwise.
 * Throws RangeError on impossible counts.
 */
export function groupVerdictRule(s: GroupRuleInput): GroupRuleResult {
  const { finished, consumed, partial, harm } = s;
  for (const v of [finished, consumed, partial, harm]) {
    if (!Number.isInteger(v) || v < 0) throw new RangeError('counts must be whole numbers ≥ 0');
  }
  if (consumed + partial + harm > finished) throw new RangeError('outcome counts exceed finished trials');
  if (finished === 0) return { verdict: null, checks: [], because: 'no finished trials' };
  const harmShare = harm / finished;
  const acceptedShare = (consumed + partial) / finished;
  const c = s.ceilingKgM2;
  const checks: ThresholdCheck[] = [
    { rule: 'avoid: harm share', value: harmShare, threshold: AVOID_MIN_HARM_SHARE, comparison: '>=', met: harmShare >= AVOID_MIN_HARM_SHARE - EPS },
    {
      rule: 'avoid: accepted share (consumed or partial)',
      value: acceptedShare,
      threshold: AVOID_MAX_ACCEPTED_SHARE,
      comparison: '<',
      met: acceptedShare < AVOID_MAX_ACCEPTED_SHARE - EPS,
    },
    { rule: 'feed: dose ceiling (kg/m²)', value: c, threshold: ORDINARY_LOAD_KGM2, comparison: '>=', met: c !== null && c >= ORDINARY_LOAD_KGM2 - EPS },
    {
      rule: 'feed: Wilson lower bound of consumed share',
      value: s.successLower,
      threshold: FEED_MIN_SUCCESS_LOWER,
      comparison: '>=',
      met: s.successLower !== null && s.successLower >= FEED_MIN_SUCCESS_LOWER - EPS,
    },
    { rule: 'feed: harm share', value: harmShare, threshold: FEED_MAX_HARM_SHARE, comparison: '<=', met: harmShare <= FEED_MAX_HARM_SHARE + EPS },
  ];
  const [avoidHarm, avoidAccepted, feedCeiling, feedLower, feedHarm] = checks.map((x) => x.met);
  if (c === null && (avoidHarm || avoidAccepted)) {
    const why = avoidHarm
      ? `harm in ${harm} of ${finished} finished trials (${pct(harmShare)}, at least ${pct(AVOID_MIN_HARM_SHARE)})`
      : `only ${consumed + partial} of ${finished} finished trials were taken at all (under ${pct(AVOID_MAX_ACCEPTED_SHARE)})`;
    return { verdict: 'avoid', checks, because: `no tested load was consumed reliably and ${why}` };
  }
  if (feedCeiling && feedLower && feedHarm) {
    return {
      verdict: 'feed',
      checks,
      because: `consumed reliably up to ${formatLoad(c as number)} kg/m² (at least the ordinary ${ORDINARY_LOAD_KGM2} kg/m²), the lower 95% bound of the consumed share is ${pct(s.successLower as number)} (at least ${pct(FEED_MIN_SUCCESS_LOWER)}) and harm in ${harm} of ${finished} (at most ${pct(FEED_MAX_HARM_SHARE)})`,
    };
  }
  const missing: string[] = [];
  if (c === null) missing.push('no tested load was consumed reliably, though most trials were taken');
  else if (!feedCeiling) missing.push(`the ceiling of ${formatLoad(c)} kg/m² is below the ordinary load of ${ORDINARY_LOAD_KGM2} kg/m²`);
  if (!feedLower && c !== null) {
    missing.push(`the lower 95% bound of the consumed share is ${pct(s.successLower ?? 0)} (under ${pct(FEED_MIN_SUCCESS_LOWER)})`);
  }
  if (!feedHarm) missing.push(`harm in ${harm} of ${finished} finished trials (over ${pct(FEED_MAX_HARM_SHARE)})`);
  return { verdict: 'limit', checks, because: missing.join('; ') };
}

/** A group as the setting rule sees it. */
export interface SettingRuleGroup {
  preparation: Preparation;
  provisional: GroupVerdict | null;
  finished: number;
}

/** The setting rule's decision. */
export interface SettingRuleResult {
  verdict: Exclude<Verdict, 'unsettled'> | null;
  driver: Preparation | null;
}

/**
 * Picks the best group among candidates: better verdict first, then more
 * finished trials, then the earlier preparation in PREPARATION_ORDER.
 * Throws nothing.
 */
export function bestGroup<T extends SettingRuleGroup>(groups: readonly T[]): T | null {
  let best: T | null = null;
  for (const g of groups) {
    if (g.provisional === null) continue;
    if (best === null) {
      best = g;
      continue;
    }
    const d = GROUP_VERDICT_RANK[g.provisional] - GROUP_VERDICT_RANK[best.provisional as GroupVerdict];
    if (
      d > 0 ||
      (d === 0 &&
        (g.finished > best.finished ||
          (g.finished === best.finished && PREPARATION_ORDER.indexOf(g.preparation) < PREPARATION_ORDER.indexOf(best.preparation))))
    ) {
      best = g;
    }
  }
  return best;
}

/**
 * Setting verdict from its groups' provisional verdicts (raw = baseline):
 * - raw `feed` → `feed`; raw `limit` → `limit` (driven by raw);
 * - otherwise, when a prepared group is `feed` or `limit` → `prepare`
 *   (driven by the best prepared group, see bestGroup);
 * - otherwise raw `avoid` → `avoid` (raw), or a prepared `avoid` → `avoid`;
 * - no finished trials → null.
 * Monotone: an absent raw group acts like raw `avoid`, and an absent prepared
 * group like prepared `avoid`.
 * Throws nothing.
 */
export function settingVerdictRule(groups: readonly SettingRuleGroup[]): SettingRuleResult {
  const raw = groups.find((g) => g.preparation === BASELINE_PREPARATION && g.provisional !== null) ?? null;
  const prepared = bestGroup(groups.filter((g) => g.preparation !== BASELINE_PREPARATION));
  if (raw && (raw.provisional === 'feed' || raw.provisional === 'limit')) {
    return { verdict: raw.provisional, driver: raw.preparation };
  }
  if (prepared && (prepared.provisional === 'feed' || prepared.provisional === 'limit')) {
    return { verdict: 'prepare', driver: prepared.preparation };
  }
  if (raw) return { verdict: 'avoid', driver: raw.preparation };
  if (prepared) return { verdict: 'avoid', driver: prepared.preparation };
  return { verdict: null, driver: null };
}
