/**
 * Every threshold and rule constant of the evidence engine, in one place.
 * Each constant says why it has its value and where the value comes from.
 * Changing any of these changes verdicts: bump RULES_VERSION with it so every
 * feedstock is recomputed and the change report is reviewed.
 */
import type { CertaintyGrade, GroupVerdict, Preparation, Setting, Verdict } from './types';

/** Version of the rules below; part of every aggregate so stored results can be compared. */
export const RULES_VERSION = 'evidence-rules-1.0.0';

// ---------------------------------------------------------------------------
// Trial classification (outcome.ts)
// ---------------------------------------------------------------------------

/**
 * A dose counts as consumed when no more than this share (%) is left.
 * Project rule: "little left" — keepers score leftovers in 25 % steps
 * (TRADE §6), so 10 % is below the first step above zero.
 */
export const CONSUMED_MAX_REMAINING_PCT = 10;

/**
 * A trial is `consumed` only when the threshold above is reached within this
 * many days of the start; later consumption makes it `partial` (slow). Project
 * rule: keepers give "only what is eaten within a few days" (TRADE §4,
 * NCSU-M) and check every week or two; four weeks is a generous window.
 * Time to consumption itself is still measured without this cap (Kaplan–Meier).
 */
export const CONSUMPTION_WINDOW_DAYS = 28;

/**
 * Bed temperature strictly above this (°C) is a `heating` event. Upper breeding
 * limit of E. fetida, 30 °C (Edwards ed. 2004, ch. 18, Table 18.3) and the
 * keeper-trial flag "above 30 °C" (TRADE §6).
 */
export const HEATING_FLAG_C = 30;

/**
 * Bed temperature at or above this (°C) is a `lethal-heat` event: E. fetida
 * dies at 35 °C (Loehr, Neuhauser & Malecki 1985).
 */
export const LETHAL_HEAT_C = 35;

/** pH strictly below this is `acidity`: breeding needs pH > 5 (Table 18.3; TRADE §6 flag). */
export const ACIDITY_PH = 5;

/** pH strictly above this is `alkalinity`: breeding needs pH < 9 (Table 18.3; TRADE §6 flag). */
export const ALKALINITY_PH = 9;

// ---------------------------------------------------------------------------
// Normalisation (normalise.ts)
// ---------------------------------------------------------------------------

/**
 * Surface loads, layer depths and feed ratios are rounded to this many decimals
 * (1 mg/m² for loads). This makes a dose entered in kg, lb or as a volume land
 * on exactly the same number despite floating-point noise (~1e-16), so the
 * verdict cannot depend on the units entered.
 */
export const LOAD_DECIMALS = 6;

// ---------------------------------------------------------------------------
// Statistics (wilson.ts, survival.ts)
// ---------------------------------------------------------------------------

/**
 * Normal quantile for 95 % Wilson intervals: exactly 1.96, not 1.959964.
 * Both reproduce Newcombe (1998) to 4 dp (REFERENCES §6a); only 1.96
 * reproduces the npm `wilson-score-interval` README values, so we pin 1.96.
 * The Kaplan–Meier interval uses the same z.
 */
export const WILSON_Z = 1.96;

/** Survival level whose time is the median time to consumption. */
export const MEDIAN_SURVIVAL = 0.5;

// ---------------------------------------------------------------------------
// Settling a verdict (verdict.ts)
// ---------------------------------------------------------------------------

/** Fewer finished trials than this leaves a group or setting `unsettled`. */
export const MIN_FINISHED_TRIALS = 3;

/**
 * Fewer distinct contributors (among finished trials) than this leaves a group
 * or setting `unsettled`: one keeper's trials are not independent.
 */
export const MIN_CONTRIBUTORS = 2;

// ---------------------------------------------------------------------------
// Dose ceiling (ceiling.ts)
// ---------------------------------------------------------------------------

/**
 * The ceiling is the highest tested load where the monotone (non-increasing)
 * fit of the consumed share stays at or above this value.
 */
export const CEILING_SUCCESS_THRESHOLD = 0.8;

// ---------------------------------------------------------------------------
// Group verdict (verdict.ts)
// ---------------------------------------------------------------------------

/**
 * An "ordinary" feeding in kg/m². `feed` needs a ceiling at or above it, so a
 * feedstock tried only in tiny amounts stays at `limit`. Project rule, about a
 * 1 cm layer of food scraps at the EPA 396 lb/yd³ density (235 kg/m³,
 * REFERENCES §4) and about one feeding of half the worm mass a day at
 * 1.6 kg worms/m² for a few days (REFERENCES §3, Ndegwa 2000; Munroe, from memory).
 */
export const ORDINARY_LOAD_KGM2 = 2;

/**
 * `feed` needs the Wilson lower bound of the consumed share (all finished
 * trials) at or above this: the evidence must say most trials are consumed.
 * With no failures this needs at least 4 trials (4/4 gives 0.51).
 */
export const FEED_MIN_SUCCESS_LOWER = 0.5;

/** `feed` needs the harm share (harm / finished) at or below this. */
export const FEED_MAX_HARM_SHARE = 0.1;

/**
 * `avoid` applies only when no tested load has a ceiling (fit below the
 * ceiling threshold everywhere) and either harm is this frequent or more...
 */
export const AVOID_MIN_HARM_SHARE = 1 / 3;

/**
 * ...or fewer than this share of finished trials were accepted at all
 * (consumed or partial): worms mostly refused it or it harmed them.
 */
export const AVOID_MAX_ACCEPTED_SHARE = 0.5;

// ---------------------------------------------------------------------------
// Setting verdict (verdict.ts)
// ---------------------------------------------------------------------------

/** The baseline preparation: a setting verdict of `prepare` means "worse than this, better prepared". */
export const BASELINE_PREPARATION: Preparation = 'raw';

/**
 * Verdict order used for every "better / worse" comparison:
 * feed > limit > prepare > avoid. `unsettled` is not ranked (see compareVerdicts).
 */
export const VERDICT_RANK: Record<Exclude<Verdict, 'unsettled'>, number> = {
  feed: 3,
  limit: 2,
  prepare: 1,
  avoid: 0,
};

/** Group verdicts in the same order. */
export const GROUP_VERDICT_RANK: Record<GroupVerdict, number> = { feed: 3, limit: 2, avoid: 0 };

/** Fixed order of settings in outputs. */
export const SETTING_ORDER: readonly Setting[] = ['bin', 'flow-through', 'bed'];

/** Fixed order of preparations in outputs (raw first, then by how much the material is changed). */
export const PREPARATION_ORDER: readonly Preparation[] = [
  'raw',
  'chopped',
  'shredded',
  'frozen-thawed',
  'soaked',
  'dried',
  'cooked',
  'aged',
  'pre-composted',
];

// ---------------------------------------------------------------------------
// Certainty (certainty.ts) — GRADE terms
// ---------------------------------------------------------------------------

/** Starting grade by the number of independent contributors among finished trials (at least this many). */
export const CERTAINTY_BASE_BY_CONTRIBUTORS: readonly { min: number; grade: CertaintyGrade }[] = [
  { min: 5, grade: 'high' },
  { min: 3, grade: 'moderate' },
  { min: 2, grade: 'low' },
  { min: 0, grade: 'very low' },
];

/** Risk of bias: downgrade when fewer than this share of finished trials had a control plot. */
export const MIN_CONTROL_SHARE = 0.5;

/** Risk of bias: downgrade when fewer than this share of finished trials had a photo. */
export const MIN_PHOTO_SHARE = 0.5;

/**
 * Inconsistency: downgrade when at least this share of finished trials
 * disagree with the monotone fit (fit ≥ 0.5 predicts consumed), i.e. the
 * split between outcomes is not explained by load.
 */
export const INCONSISTENCY_MIN_DISAGREEMENT = 0.25;

/** A fitted value at or above this predicts `consumed` when checking inconsistency (ties predict consumed). */
export const FIT_PREDICTS_CONSUMED = 0.5;

/** Imprecision: downgrade with fewer finished trials than this... */
export const IMPRECISION_MIN_TRIALS = 5;

/** ...or when the Wilson interval of the consumed share is wider than this. */
export const IMPRECISION_MAX_WIDTH = 0.5;

// ---------------------------------------------------------------------------
// Derivation (derivation.ts)
// ---------------------------------------------------------------------------

/** The "what would change it" search adds at most this many hypothetical trials at one load. */
export const MAX_HYPOTHETICAL_TRIALS = 5;

/** ...at no more than this many candidate loads per group. */
export const MAX_HYPOTHETICAL_LOADS = 4;

/** At most this many trial ids are listed as driving a result. */
export const DRIVING_TRIAL_LIMIT = 20;
