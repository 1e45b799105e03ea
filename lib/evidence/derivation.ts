/**
 * Plain-English derivations: number formatting and the sentences that explain
 * a group or setting verdict ("7 of 8 finished trials in open beds were
 * consumed; heating in 3, all above 6 kg/m²; …").
 */
import { CEILING_SUCCESS_THRESHOLD, CONSUMPTION_WINDOW_DAYS, MIN_CONTRIBUTORS, MIN_FINISHED_TRIALS } from './thresholds';
import type {
  Caution,
  CeilingEstimate,
  Certainty,
  GroupCounts,
  GroupVerdict,
  Preparation,
  ProportionEstimate,
  Setting,
  SurvivalEstimate,
  Verdict,
  WhatWouldChange,
} from './types';
import { formatLoad } from './units';
import { VERDICT_LABELS } from './verdict';


/** Words for settings, used inside sentences. */
export const SETTING_WORDS: Readonly<Record<Setting, string>> = {
  bin: 'in enclosed bins',
  'flow-through': 'in flow-through systems',
  bed: 'in open beds',
};

/** Words for preparations, used inside sentences. */
export const PREPARATION_WORDS: Readonly<Record<Preparation, string>> = {
  raw: 'raw',
  chopped: 'chopped',
  shredded: 'shredded or mulched',
  'frozen-thawed': 'frozen and thawed',
  cooked: 'cooked',
  soaked: 'soaked',
  dried: 'dried',
  'pre-composted': 'pre-composted',
  aged: 'aged',
};

const NUMBER_WORDS = ['no', 'one', 'two', 'three', 'four', 'five', 'six', 'seven', 'eight', 'nine', 'ten'];

/** "two" for 2 (up to ten), digits above. Throws RangeError on a negative or fractional count. */
export function countWord(k: number): string {
  if (!Number.isInteger(k) || k < 0) throw new RangeError('count must be a whole number ≥ 0');
  return k < NUMBER_WORDS.length ? NUMBER_WORDS[k] : String(k);
}

function capitalise(s: string): string {
  return s.length === 0 ? s : s[0].toUpperCase() + s.slice(1);
}

/** A share 0..1 as a whole percentage, "88%". Throws nothing. */
export function formatPct(x: number): string {
  return `${Math.round(x * 100)}%`;
}

function keepers(n: number): string {
  return n === 1 ? '1 keeper' : `${n} keepers`;
}

function trialsWord(n: number): string {
  return n === 1 ? '1 trial' : `${n} trials`;
}

/** Everything the group sentences need. */
export interface GroupSentenceInput {
  setting: Setting;
  preparation: Preparation;
  counts: GroupCounts;
  success: ProportionEstimate;
  ceiling: CeilingEstimate;
  timeToConsumption: SurvivalEstimate;
  cautions: readonly Caution[];
  harmless: readonly { pest: string; trials: number }[];
  certainty: Certainty;
  verdict: Verdict;
  provisional: GroupVerdict | null;
  because: string;
}

/** Plain sentences explaining a group's verdict, in reading order. Throws nothing for a consistent input. */
export function groupSentences(g: GroupSentenceInput): string[] {
  const out: string[] = [];
  const where = `${capitalise(PREPARATION_WORDS[g.preparation])}, ${SETTING_WORDS[g.setting]}`;
  const c = g.counts;
  const open = c.trials - c.finished;
  const openText = open > 0 ? ` (${open} more still open)` : '';
  if (c.finished === 0) {
    out.push(`${where}: no finished trials yet${openText}.`);
  } else {
    const s = g.success;
    out.push(
      `${where}: ${c.consumed} of ${c.finished} finished trials were consumed within ${CONSUMPTION_WINDOW_DAYS} days (${formatPct(s.proportion as number)}; 95% interval ${formatPct(s.lower as number)}–${formatPct(s.upper as number)})${openText}.`,
    );
    const rest: string[] = [];
    if (c.partial > 0) rest.push(`${c.partial} partly eaten or slow`);
    if (c.rejected > 0) rest.push(`${c.rejected} left alone by the worms`);
    if (c.harm > 0) rest.push(`${c.harm} with harm (worm deaths or worms leaving)`);
    if (rest.length > 0) out.push(`Of the rest: ${rest.join(', ')}.`);
    const ce = g.ceiling;
    const thr = formatPct(CEILING_SUCCESS_THRESHOLD);
    if (ce.kgM2 === null) {
      out.push(
        `No tested load (${formatLoad(ce.lowestTestedKgM2 as number)}–${formatLoad(ce.highestTestedKgM2 as number)} kg/m²) was consumed reliably: the fitted consumed share is under ${thr} from the lowest load.`,
      );
    } else if (ce.isHighestTested) {
      out.push(`Consumed reliably at every tested load, up to ${formatLoad(ce.kgM2)} kg/m² (fitted consumed share at least ${thr}).`);
    } else {
      out.push(
        `Consumed reliably up to ${formatLoad(ce.kgM2)} kg/m²; from ${formatLoad(ce.nextLoadAboveKgM2 as number)} kg/m² the fitted consumed share falls under ${thr}.`,
      );
    }
  }
  if (g.cautions.length > 0) out.push(`${g.cautions.map((x) => x.text).join('; ')}.`);
  for (const h of g.harmless) out.push(`${capitalise(h.pest)} seen in ${trialsWord(h.trials)} (harmless decomposers, not counted as a problem).`);
  const km = g.timeToConsumption;
  if (km.n > 0) {
    if (km.median !== null) {
      const ci =
        km.medianLower !== null
          ? km.medianUpper !== null
            ? `95% interval ${km.medianLower}–${km.medianUpper} days`
            : `95% interval from ${km.medianLower} days, upper end not reached`
          : '95% interval not estimable';
      const censored = km.censored > 0 ? `; ${km.censored} of ${km.n} trials still open or never eaten, counted up to their last check-in` : '';
      out.push(`Half of the doses were eaten by day ${km.median} (${ci}${censored}).`);
    } else {
      out.push(`Fewer than half of the doses were eaten during follow-up (${km.events} of ${km.n} eaten; the rest counted up to their last check-in).`);
    }
  }
  if (g.verdict === 'unsettled') {
    const rules = g.provisional ? ` On the rules alone it would read ${VERDICT_LABELS[g.provisional]}.` : '';
    out.push(
      `${VERDICT_LABELS.unsettled}: ${trialsWord(c.finished)} finished by ${keepers(c.finishedContributors)}; a verdict needs ${MIN_FINISHED_TRIALS} finished trials by ${MIN_CONTRIBUTORS} keepers.${rules}`,
    );
  } else {
    out.push(`${VERDICT_LABELS[g.verdict]}: ${g.because}.`);
  }
  out.push(certaintySentence(g.certainty));
  return out;
}

/** One sentence naming the certainty grade and why it was lowered. Throws nothing. */
export function certaintySentence(c: Certainty): string {
  const lowered = c.downgrades.map((d) => `${d.domain} (${d.reasons.join('; ')})`);
  return `Certainty ${c.grade}: ${c.baseReason}${lowered.length > 0 ? `; lowered for ${lowered.join(', ')}` : ''}.`;
}

/** Sentence for one hypothetical change. Throws RangeError on a negative or fractional trial count. */
export function whatWouldChangeText(
  w: Omit<WhatWouldChange, 'text'>,
  scope: 'group' | 'setting',
): string {
  const trials = w.trials === 1 ? 'trial' : 'trials';
  const prep = scope === 'setting' ? `${PREPARATION_WORDS[w.preparation]} ` : '';
  const what =
    w.kind === 'consumed'
      ? `${capitalise(countWord(w.trials))} more consumed ${prep}${trials}`
      : `${capitalise(countWord(w.trials))} more ${prep}${trials} with harm`;
  const fromOthers = w.from === 'unsettled' ? ', from other keepers,' : '';
  const target = scope === 'setting' ? 'this setting' : 'it';
  const move = w.from === 'unsettled' ? `would settle ${target} at ${VERDICT_LABELS[w.to]}` : `would move ${target} to ${VERDICT_LABELS[w.to]}`;
  return `${what} at ${formatLoad(w.loadKgM2)} kg/m²${fromOthers} ${move}.`;
}

/** Everything the setting sentences need. */
export interface SettingSentenceInput {
  setting: Setting;
  verdict: Verdict;
  provisional: Verdict | null;
  driver: Preparation | null;
  groups: readonly { preparation: Preparation; verdict: Verdict; provisionalVerdict: GroupVerdict | null; finished: number }[];
  counts: { trials: number; finished: number; finishedContributors: number };
  ceilingKgM2: number | null;
  certainty: Certainty | null;
}

/** Plain sentences explaining a setting verdict. Throws nothing for a consistent input. */
export function settingSentences(s: SettingSentenceInput): string[] {
  const out: string[] = [];
  const where = capitalise(SETTING_WORDS[s.setting]);
  const parts = s.groups.map((g) =>
    g.provisionalVerdict === null
      ? `${PREPARATION_WORDS[g.preparation]}: no finished trials`
      : `${PREPARATION_WORDS[g.preparation]}: ${VERDICT_LABELS[g.provisionalVerdict]} (${trialsWord(g.finished)} finished${g.verdict === 'unsettled' ? ', not yet settled' : ''})`,
  );
  out.push(`${where}: ${parts.join('; ')}.`);
  if (s.verdict === 'unsettled') {
    const rules = s.provisional ? ` On the rules alone it would read ${VERDICT_LABELS[s.provisional]}.` : '';
    out.push(
      `${VERDICT_LABELS.unsettled}: ${trialsWord(s.counts.finished)} finished by ${keepers(s.counts.finishedContributors)} in this setting; a verdict needs ${MIN_FINISHED_TRIALS} finished trials by ${MIN_CONTRIBUTORS} keepers.${rules}`,
    );
  } else if (s.driver !== null) {
    const v = s.verdict;
    const d = PREPARATION_WORDS[s.driver];
    const why =
      v === 'prepare'
        ? `raw material does not do well enough, but ${d} material reads ${VERDICT_LABELS[s.groups.find((g) => g.preparation === s.driver)?.provisionalVerdict ?? 'limit']}`
        : v === 'avoid'
          ? `no preparation tried here does better than ${VERDICT_LABELS.avoid} (driven by the ${d} trials)`
          : `driven by the ${d} trials`;
    out.push(`${VERDICT_LABELS[v]}: ${why}.`);
  }
  if (s.driver !== null && s.ceilingKgM2 !== null) {
    out.push(`Dose ceiling (${PREPARATION_WORDS[s.driver]}): ${formatLoad(s.ceilingKgM2)} kg/m².`);
  }
  if (s.certainty) out.push(certaintySentence(s.certainty));
  return out;
}
