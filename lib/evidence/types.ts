/**
 * Shared types of the evidence engine. Everything here is plain data: inputs
 * and outputs are JSON-serialisable (optional numbers are `null`, never
 * `undefined`, `NaN` or `Infinity`).
 */

/** Mass units accepted on input (NIST SP 811 factors in units.ts). */
export type MassUnit = 'kg' | 'g' | 'lb' | 'oz';
/** Volume units accepted on input; `gal` and `qt` are US liquid measures. */
export type VolumeUnit = 'L' | 'mL' | 'gal' | 'qt' | 'm3' | 'yd3' | 'ft3';
/** Area units accepted on input. */
export type AreaUnit = 'm2' | 'ft2';
/** Length units accepted on input (layer depth, bin depth). */
export type LengthUnit = 'cm' | 'in';
/** Temperature units: degrees Celsius or Fahrenheit. */
export type TemperatureUnit = 'C' | 'F';

/** An amount with its unit, as a person entered it. */
export interface Quantity<U extends string> {
  amount: number;
  unit: U;
}

/** A dose entered either as a mass or as a volume (volume needs a bulk density). */
export type DoseQuantity = Quantity<MassUnit> | Quantity<VolumeUnit>;

/** Where a trial is run. */
export type Setting = 'bin' | 'flow-through' | 'bed';
/** How the feedstock was prepared before it went in. */
export type Preparation =
  | 'raw'
  | 'chopped'
  | 'shredded'
  | 'frozen-thawed'
  | 'cooked'
  | 'soaked'
  | 'dried'
  | 'pre-composted'
  | 'aged';
/** Life-cycle state of a trial. */
export type TrialStatus = 'running' | 'closed' | 'abandoned';
/** Outcome of one trial. */
export type Outcome = 'consumed' | 'partial' | 'rejected' | 'harm';
/** Evidence verdict codes (labels in derivation.ts). */
export type Verdict = 'feed' | 'limit' | 'prepare' | 'avoid' | 'unsettled';
/** Verdict a single setting × preparation group can reach on its own. */
export type GroupVerdict = 'feed' | 'limit' | 'avoid';
/** GRADE certainty levels. */
export type CertaintyGrade = 'high' | 'moderate' | 'low' | 'very low';

/** How many worms a check-in saw in the feedstock. */
export type WormActivity = 'none' | 'few' | 'many' | 'swarming';
/** Smell of the feedstock at a check-in. */
export type Smell = 'none' | 'earthy' | 'sour' | 'rotten' | 'ammonia';
/** Moisture of the bed at a check-in, as a keeper judges it by hand. */
export type MoistureLevel = 'dry' | 'damp' | 'wet' | 'waterlogged';
/** Organisms a keeper can tick on a check-in. Springtails are recorded but harmless. */
export type Pest =
  | 'flatworms'
  | 'mites'
  | 'fruit-flies'
  | 'fungus-gnats'
  | 'ants'
  | 'rodents'
  | 'springtails';

/** Adverse events read off check-ins (rules in outcome.ts, thresholds in thresholds.ts). */
export type AdverseEvent =
  | 'heating'
  | 'lethal-heat'
  | 'mould'
  | 'sour-smell'
  | 'rotten-smell'
  | 'ammonia-smell'
  | 'acidity'
  | 'alkalinity'
  | 'waterlogging'
  | 'exodus'
  | 'worm-deaths'
  | 'flatworms'
  | 'mites'
  | 'fruit-flies'
  | 'fungus-gnats'
  | 'ants'
  | 'rodents';

/** One visit to a trial bed. */
export interface CheckIn {
  /** Calendar date, `YYYY-MM-DD`. */
  date: string;
  wormActivity: WormActivity;
  /** Share of the dose still visible, 0..100. */
  shareRemainingPct: number;
  bedTempC?: number | null;
  mould: boolean;
  smell: Smell;
  moisture: MoistureLevel;
  pH?: number | null;
  pests: Pest[];
  wormDeaths?: boolean | null;
  exodus?: boolean | null;
}

/** A dose as entered: amount, bed area, and what is needed to turn it into loads. */
export interface DoseEntry {
  dose: DoseQuantity;
  area: Quantity<AreaUnit>;
  /** Bulk density of the feedstock in kg/m³; required when the dose is a volume. */
  bulkDensityKgM3?: number | null;
  /** Layer depth as entered; estimated from volume / area when absent. */
  layerDepth?: Quantity<LengthUnit> | null;
  /** Worm mass in the bed, when known (gives the feed ratio). */
  wormMass?: Quantity<MassUnit> | null;
}

/** Dose expressed on the engine's common scales. */
export interface NormalisedDose {
  massKg: number;
  areaM2: number;
  /** kg of fresh feedstock per m² of bed surface per application (rounded, see LOAD_DECIMALS). */
  surfaceLoadKgM2: number;
  layerDepthCm: number | null;
  layerDepthSource: 'entered' | 'estimated' | null;
  /** kg feedstock per kg worms, when worm mass is known. */
  feedRatio: number | null;
}

/** One feeding trial as the engine receives it. Give either `surfaceLoadKgM2` or `dose`. */
export interface TrialInput {
  id: string;
  contributorId: string;
  setting: Setting;
  preparation: Preparation;
  status: TrialStatus;
  /** `YYYY-MM-DD`; check-in days are counted from here. */
  startDate: string;
  surfaceLoadKgM2?: number | null;
  /** Raw dose entry; when present it is normalised and wins over `surfaceLoadKgM2`. */
  dose?: DoseEntry | null;
  layerDepthCm?: number | null;
  feedRatio?: number | null;
  hasControl: boolean;
  photoCount: number;
  /** The owner's confirmed outcome; wins over the classifier. */
  outcomeOverride?: Outcome | null;
  checkIns: CheckIn[];
}

/** First day (from the start) an adverse event was seen in a trial. */
export interface AdverseEventRecord {
  event: AdverseEvent;
  firstDay: number;
}

/** Result of classifying one trial. */
export interface TrialClassification {
  /** `null` while there is no decisive evidence (running / abandoned, or no check-ins). */
  outcome: Outcome | null;
  /** Where the outcome came from. */
  outcomeSource: 'owner' | 'check-ins' | null;
  adverseEvents: AdverseEventRecord[];
  /** Day the consumed threshold was first reached with worms present; `null` if never. */
  daysToConsumption: number | null;
  /** `true` when the time to consumption is censored (not observed). */
  censored: boolean;
  /** Day of the last check-in (follow-up time), `null` without check-ins. */
  followUpDays: number | null;
  /** Harmless organisms seen (springtails). */
  harmless: Pest[];
  reasons: string[];
}

/** Wilson score interval for a proportion. */
export interface ProportionEstimate {
  successes: number;
  n: number;
  /** Point estimate, `null` when n = 0. */
  proportion: number | null;
  lower: number | null;
  upper: number | null;
  /** Normal quantile used (pinned in thresholds.ts). */
  z: number;
}

/** One block of the pool-adjacent-violators fit: loads in [fromKgM2, toKgM2] share one fitted value. */
export interface FitBlock {
  fromKgM2: number;
  toKgM2: number;
  fitted: number;
  /** Number of finished trials pooled in the block. */
  weight: number;
}

/** Dose ceiling from the monotone fit. */
export interface CeilingEstimate {
  /** Highest tested load whose fitted success share is at or above the threshold; `null` if none. */
  kgM2: number | null;
  threshold: number;
  /** `true` when every tested load met the threshold, so the true ceiling may be higher. */
  isHighestTested: boolean;
  lowestTestedKgM2: number | null;
  highestTestedKgM2: number | null;
  /** Lowest tested load above the ceiling (fit below the threshold), `null` if none. */
  nextLoadAboveKgM2: number | null;
  blocks: FitBlock[];
  /** Trials at exactly the ceiling load. */
  trialIdsAtCeiling: string[];
}

/** One row of a Kaplan–Meier table (one distinct time). */
export interface SurvivalRow {
  time: number;
  atRisk: number;
  events: number;
  censored: number;
  survival: number;
  /** Pointwise log-log band (Greenwood); `null` where undefined. */
  lower: number | null;
  upper: number | null;
}

/** Kaplan–Meier estimate of time to consumption. */
export interface SurvivalEstimate {
  n: number;
  events: number;
  censored: number;
  /** Smallest time with S(t) ≤ 0.5; `null` if the curve never reaches 0.5. */
  median: number | null;
  /** Brookmeyer–Crowley 95% interval of the median (log-log Greenwood); `null` where not reached. */
  medianLower: number | null;
  medianUpper: number | null;
  method: string;
  table: SurvivalRow[];
}

/** A caution: an adverse event with its frequency and the loads it occurred at. */
export interface Caution {
  event: AdverseEvent;
  /** Trials with the event. */
  trials: number;
  /** Trials with at least one check-in (the denominator). */
  outOf: number;
  minLoadKgM2: number;
  maxLoadKgM2: number;
  /** 'above': every trial with the event had a load above `boundaryKgM2`, the highest load without it. */
  pattern: 'above' | 'all-loads' | 'mixed';
  boundaryKgM2: number | null;
  trialIds: string[];
  text: string;
}

/** One GRADE downgrade. */
export interface CertaintyDowngrade {
  domain: 'risk of bias' | 'inconsistency' | 'indirectness' | 'imprecision';
  levels: number;
  reasons: string[];
}

/** Certainty of a verdict in GRADE terms. */
export interface Certainty {
  grade: CertaintyGrade;
  base: CertaintyGrade;
  baseReason: string;
  downgrades: CertaintyDowngrade[];
}

/** A threshold compared during the derivation. */
export interface ThresholdCheck {
  rule: string;
  value: number | null;
  threshold: number;
  comparison: '>=' | '<=' | '<' | '>';
  met: boolean;
}

/** A hypothetical change that would move a verdict. */
export interface WhatWouldChange {
  kind: 'consumed' | 'harm';
  trials: number;
  loadKgM2: number;
  preparation: Preparation;
  from: Verdict;
  to: Verdict;
  text: string;
}

/** How a result was reached, in numbers and in plain sentences. */
export interface Derivation {
  numbers: Record<string, number | null>;
  thresholds: ThresholdCheck[];
  /** Trials that drove the result (at most DRIVING_TRIAL_LIMIT, sorted by id). */
  drivingTrialIds: string[];
  sentences: string[];
  whatWouldChange: WhatWouldChange[];
}

/** Counts of a group. */
export interface GroupCounts {
  trials: number;
  /** Trials with an outcome (closed, owner-confirmed, or decisive while running/abandoned). */
  finished: number;
  running: number;
  closed: number;
  abandoned: number;
  consumed: number;
  partial: number;
  rejected: number;
  harm: number;
  /** Distinct contributors among all trials. */
  contributors: number;
  /** Distinct contributors among finished trials (used for settling and certainty). */
  finishedContributors: number;
  /** Finished trials with a control plot / with at least one photo. */
  withControl: number;
  withPhotos: number;
}

/** Evidence for one feedstock × setting × preparation. */
export interface GroupAggregate {
  key: string;
  setting: Setting;
  preparation: Preparation;
  trialIds: string[];
  counts: GroupCounts;
  success: ProportionEstimate;
  harm: ProportionEstimate;
  ceiling: CeilingEstimate;
  timeToConsumption: SurvivalEstimate;
  cautions: Caution[];
  /** Harmless residents seen, e.g. springtails, with trial counts. */
  harmless: { pest: Pest; trials: number }[];
  certainty: Certainty;
  settled: boolean;
  /** Verdict from the rules regardless of settling; `null` without finished trials. */
  provisionalVerdict: GroupVerdict | null;
  /** `unsettled` unless settled, else the provisional verdict. */
  verdict: Verdict;
  label: string;
  derivation: Derivation;
}

/** Verdict of one setting, combining its preparation groups. */
export interface SettingVerdict {
  setting: Setting;
  verdict: Verdict;
  label: string;
  settled: boolean;
  provisionalVerdict: Exclude<Verdict, 'unsettled'> | null;
  /** The group whose verdict drove this one. */
  drivenBy: { preparation: Preparation; key: string } | null;
  /** Ceiling of the driving group. */
  ceiling: { kgM2: number | null; preparation: Preparation | null };
  certainty: Certainty | null;
  groups: { preparation: Preparation; verdict: Verdict; provisionalVerdict: GroupVerdict | null }[];
  counts: { trials: number; finished: number; finishedContributors: number };
  derivation: Derivation;
}

/** Options of `aggregateFeedstock`. */
export interface AggregateOptions {
  /** Run the hypothetical-trial search for "what would change it" (default true). */
  whatWouldChange?: boolean;
}

/** Output of `aggregateFeedstock`. */
export interface FeedstockAggregate {
  groups: GroupAggregate[];
  settings: SettingVerdict[];
  rulesVersion: string;
}
