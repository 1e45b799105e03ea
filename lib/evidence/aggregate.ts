/**
 * Aggregation of one feedstock's trials per setting × preparation and per
 * setting. Deterministic and independent of input order: trials are sorted by
 * id (code-unit order) before anything else, and every statistic is computed
 * from integer counts.
 */
import { computeCautions } from './cautions';
import { ceilingEstimateFromPooled, hypotheticalCeiling, poolByLoad, type PooledLoads } from './ceiling';
import { gradeCertainty } from './certainty';
import { groupSentences, settingSentences, whatWouldChangeText } from './derivation';
import { normaliseTrial } from './normalise';
import { summariseTrial, type TrialSummary } from './outcome';
import { kaplanMeier, type SurvivalObservation } from './survival';
import {
  BASELINE_PREPARATION,
  DRIVING_TRIAL_LIMIT,
  FIT_PREDICTS_CONSUMED,
  MAX_HYPOTHETICAL_LOADS,
  MAX_HYPOTHETICAL_TRIALS,
  MIN_CONTRIBUTORS,
  MIN_FINISHED_TRIALS,
  ORDINARY_LOAD_KGM2,
  PREPARATION_ORDER,
  RULES_VERSION,
  SETTING_ORDER,
} from './thresholds';
import type {
  AggregateOptions,
  Derivation,
  FeedstockAggregate,
  GroupAggregate,
  GroupCounts,
  GroupVerdict,
  Outcome,
  Pest,
  Preparation,
  Setting,
  SettingVerdict,
  ThresholdCheck,
  TrialInput,
  Verdict,
  WhatWouldChange,
} from './types';
import { compareVerdicts, groupVerdictRule, isSettled, settingVerdictRule, verdictLabel } from './verdict';
import { proportionEstimate, wilson } from './wilson';

/** A trial after normalisation and classification. */
export interface PreparedTrial {
  id: string;
  contributorId: string;
  setting: Setting;
  preparation: Preparation;
  status: TrialInput['status'];
  loadKgM2: number;
  hasControl: boolean;
  hasPhotos: boolean;
  hasCheckIns: boolean;
  /** Adverse events seen, bit k = ADVERSE_EVENTS[k]. */
  eventMask: number;
  classification: TrialSummary;
}

/**
 * Validates, normalises and classifies one trial.
 * Throws RangeError on a missing id/contributor, unknown setting, preparation
 * or status, a bad photo count, or anything normaliseTrial / classifyTrial reject.
 */
export function prepareTrial(t: TrialInput): PreparedTrial {
  if (typeof t.id !== 'string' || t.id.length === 0) throw new RangeError('trial id must be a non-empty string');
  if (typeof t.contributorId !== 'string' || t.contributorId.length === 0) {
    throw new RangeError(`trial ${t.id}: contributorId must be a non-empty string`);
  }
  if (SETTING_INDEX[t.setting] === undefined) throw new RangeError(`trial ${t.id}: unknown setting ${String(t.setting)}`);
  if (PREP_INDEX[t.preparation] === undefined) throw new RangeError(`trial ${t.id}: unknown preparation ${String(t.preparation)}`);
  if (!Number.isInteger(t.photoCount) || t.photoCount < 0) throw new RangeError(`trial ${t.id}: photoCount must be a whole number ≥ 0`);
  if (typeof t.hasControl !== 'boolean') throw new RangeError(`trial ${t.id}: hasControl must be true or false`);
  const loads = normalise(t);
  const classification = summarise(t);
  return {
    id: t.id,
    contributorId: t.contributorId,
    setting: t.setting,
    preparation: t.preparation,
    status: t.status,
    loadKgM2: loads.surfaceLoadKgM2,
    hasControl: t.hasControl,
    hasPhotos: t.photoCount > 0,
    hasCheckIns: classification.followUpDays !== null,
    eventMask: classification.eventMask,
    classification,
  };
}

/** Internal state kept per group for the hypothetical search. */
interface GroupState {
  setting: Setting;
  preparation: Preparation;
  pooled: PooledLoads;
  finished: number;
  consumed: number;
  partial: number;
  harm: number;
  finishedContributors: number;
  candidates: number[];
  /** [kind][loadIndex][k-1] → provisional verdict after adding k trials. */
  table: (GroupVerdict | null)[][][] | null;
  aggregate: GroupAggregate | null;
}

const KINDS = ['consumed', 'harm'] as const;

const SETTING_INDEX: Record<string, number> = Object.fromEntries(SETTING_ORDER.map((s, i) => [s, i]));
const PREP_INDEX: Record<string, number> = Object.fromEntries(PREPARATION_ORDER.map((p, i) => [p, i]));
const normalise = normaliseTrial;
const summarise = summariseTrial;

function prepIndex(p: Preparation): number {
  return PREP_INDEX[p];
}

function firstIds(trials: readonly PreparedTrial[], pick: (t: PreparedTrial) => boolean): string[] {
  const out: string[] = [];
  for (const t of trials) {
    if (out.length >= DRIVING_TRIAL_LIMIT) break;
    if (pick(t)) out.push(t.id);
  }
  return out;
}

function candidateLoads(
  ceiling: { kgM2: number | null; nextLoadAboveKgM2: number | null; lowestTestedKgM2: number | null; highestTestedKgM2: number | null },
): number[] {
  const wanted = [ceiling.nextLoadAboveKgM2, ceiling.kgM2, ORDINARY_LOAD_KGM2, ceiling.lowestTestedKgM2, ceiling.highestTestedKgM2];
  const out: number[] = [];
  for (const x of wanted) {
    if (x === null || out.includes(x)) continue;
    out.push(x);
    if (out.length >= MAX_HYPOTHETICAL_LOADS) break;
  }
  return out.sort((a, b) => a - b);
}

/** Provisional verdict of a group after adding k hypothetical trials of one kind at one load. */
function hypotheticalProvisional(st: GroupState, kind: (typeof KINDS)[number], load: number, k: number): GroupVerdict | null {
  const ceilingKgM2 = hypotheticalCeiling(st.pooled, load, kind === 'consumed' ? k : 0, k);
  const finished = st.finished + k;
  const consumed = st.consumed + (kind === 'consumed' ? k : 0);
  const harm = st.harm + (kind === 'harm' ? k : 0);
  return groupVerdictRule({
    finished,
    consumed,
    partial: st.partial,
    harm,
    successLower: wilson(consumed, finished).lower,
    ceilingKgM2,
  }).verdict;
}

function buildTable(st: GroupState): (GroupVerdict | null)[][][] {
  if (st.table) return st.table;
  st.table = KINDS.map((kind) =>
    st.candidates.map((load) => {
      const row: (GroupVerdict | null)[] = [];
      for (let k = 1; k <= MAX_HYPOTHETICAL_TRIALS; k++) row.push(hypotheticalProvisional(st, kind, load, k));
      return row;
    }),
  );
  return st.table;
}

function moves(kind: (typeof KINDS)[number], from: Verdict, to: Verdict): boolean {
  if (from === 'unsettled') return to !== 'unsettled';
  if (to === 'unsettled') return false;
  const d = compareVerdicts(to, from) as number;
  return kind === 'consumed' ? d > 0 : d < 0;
}

function groupWhatWouldChange(st: GroupState, current: Verdict): WhatWouldChange[] {
  const table = buildTable(st);
  const out: WhatWouldChange[] = [];
  KINDS.forEach((kind, ki) => {
    let best: Omit<WhatWouldChange, 'text'> | null = null;
    for (let k = 1; k <= MAX_HYPOTHETICAL_TRIALS && best === null; k++) {
      // candidates are ascending: the first hit at this k is the lowest load
      for (let li = 0; li < st.candidates.length; li++) {
        const prov = table[ki][li][k - 1];
        const settled = isSettled(st.finished + k, st.finishedContributors + k);
        const to: Verdict = settled && prov !== null ? prov : 'unsettled';
        if (moves(kind, current, to)) {
          best = { kind, trials: k, loadKgM2: st.candidates[li], preparation: st.preparation, from: current, to };
          break;
        }
      }
    }
    if (best) out.push({ ...best, text: whatWouldChangeText(best, 'group') });
  });
  return out;
}

function buildGroup(setting: Setting, preparation: Preparation, trials: readonly PreparedTrial[], opts: Required<AggregateOptions>): GroupState {
  const contributors = new Set<string>();
  const finishedContributors = new Set<string>();
  const points: { id: string; loadKgM2: number; success: boolean }[] = [];
  const km: SurvivalObservation[] = [];
  let springtails = 0;
  let running = 0;
  let closed = 0;
  let consumed = 0;
  let partial = 0;
  let rejected = 0;
  let harmCount = 0;
  let withControl = 0;
  let withPhotos = 0;
  for (const t of trials) {
    contributors.add(t.contributorId);
    if (t.status === 'running') running++;
    else if (t.status === 'closed') closed++;
    const c = t.classification;
    const o: Outcome | null = c.outcome;
    if (o !== null) {
      if (o === 'consumed') consumed++;
      else if (o === 'partial') partial++;
      else if (o === 'rejected') rejected++;
      else harmCount++;
      finishedContributors.add(t.contributorId);
      if (t.hasControl) withControl++;
      if (t.hasPhotos) withPhotos++;
      points.push({ id: t.id, loadKgM2: t.loadKgM2, success: o === 'consumed' });
    }
    if (c.followUpDays !== null) {
      km.push(c.daysToConsumption !== null ? { time: c.daysToConsumption, event: true } : { time: c.followUpDays, event: false });
    }
    if (c.springtails) springtails++;
  }
  const counts: GroupCounts = {
    trials: trials.length,
    finished: points.length,
    running,
    closed,
    abandoned: trials.length - running - closed,
    consumed,
    partial,
    rejected,
    harm: harmCount,
    contributors: contributors.size,
    finishedContributors: finishedContributors.size,
    withControl,
    withPhotos,
  };

  const success = proportionEstimate(counts.consumed, counts.finished);
  const harm = proportionEstimate(counts.harm, counts.finished);
  const pooled = poolByLoad(points);
  const ceiling = ceilingEstimateFromPooled(pooled, points);
  const timeToConsumption = kaplanMeier(km);
  const cautions = computeCautions(trials);

  // Disagreement with the monotone fit, for inconsistency (fit ≥ FIT_PREDICTS_CONSUMED predicts consumed).
  let disagreements = 0;
  {
    let bi = 0;
    const blocks = ceiling.blocks;
    for (let i = 0; i < pooled.loads.length; i++) {
      while (bi < blocks.length && pooled.loads[i] > blocks[bi].toKgM2) bi++;
      const fit = blocks[bi].fitted;
      disagreements += fit >= FIT_PREDICTS_CONSUMED ? pooled.weights[i] - pooled.successes[i] : pooled.successes[i];
    }
  }

  const certainty = gradeCertainty({
    finished: counts.finished,
    finishedContributors: counts.finishedContributors,
    withControl: counts.withControl,
    withPhotos: counts.withPhotos,
    disagreements,
    successLower: success.lower,
    successUpper: success.upper,
  });

  const rule = groupVerdictRule({
    finished: counts.finished,
    consumed: counts.consumed,
    partial: counts.partial,
    harm: counts.harm,
    successLower: success.lower,
    ceilingKgM2: ceiling.kgM2,
  });
  const settled = isSettled(counts.finished, counts.finishedContributors);
  const verdict: Verdict = settled && rule.verdict !== null ? rule.verdict : 'unsettled';

  const st: GroupState = {
    setting,
    preparation,
    pooled,
    finished: counts.finished,
    consumed: counts.consumed,
    partial: counts.partial,
    harm: counts.harm,
    finishedContributors: counts.finishedContributors,
    candidates: candidateLoads(ceiling),
    table: null,
    aggregate: null,
  };

  const settledChecks: ThresholdCheck[] = [
    { rule: 'settled: finished trials', value: counts.finished, threshold: MIN_FINISHED_TRIALS, comparison: '>=', met: counts.finished >= MIN_FINISHED_TRIALS },
    {
      rule: 'settled: independent contributors',
      value: counts.finishedContributors,
      threshold: MIN_CONTRIBUTORS,
      comparison: '>=',
      met: counts.finishedContributors >= MIN_CONTRIBUTORS,
    },
  ];

  const finishedPick = (t: PreparedTrial) => t.classification.outcome !== null;
  let driving: string[];
  const prov = rule.verdict;
  if (verdict === 'unsettled' || prov === null) driving = firstIds(trials, finishedPick);
  else if (prov === 'avoid') driving = firstIds(trials, (t) => t.classification.outcome === 'harm' || t.classification.outcome === 'rejected');
  else if (prov === 'feed') driving = firstIds(trials, (t) => t.classification.outcome === 'consumed');
  else {
    const c = ceiling.kgM2;
    driving = firstIds(trials, (t) =>
      c === null
        ? t.classification.outcome !== null && t.classification.outcome !== 'consumed'
        : t.classification.outcome !== null && (t.loadKgM2 === c || (t.loadKgM2 > c && t.classification.outcome !== 'consumed')),
    );
  }

  const harmlessList: { pest: Pest; trials: number }[] = springtails > 0 ? [{ pest: 'springtails', trials: springtails }] : [];
  const km0 = timeToConsumption;
  const derivation: Derivation = {
    numbers: {
      trials: counts.trials,
      finished: counts.finished,
      consumed: counts.consumed,
      partial: counts.partial,
      rejected: counts.rejected,
      harm: counts.harm,
      contributors: counts.contributors,
      finishedContributors: counts.finishedContributors,
      successShare: success.proportion,
      successLower: success.lower,
      successUpper: success.upper,
      harmShare: harm.proportion,
      ceilingKgM2: ceiling.kgM2,
      lowestTestedKgM2: ceiling.lowestTestedKgM2,
      highestTestedKgM2: ceiling.highestTestedKgM2,
      nextLoadAboveKgM2: ceiling.nextLoadAboveKgM2,
      medianDaysToConsumption: km0.median,
      medianLowerDays: km0.medianLower,
      medianUpperDays: km0.medianUpper,
      disagreementsWithLoadPattern: disagreements,
    },
    thresholds: [...settledChecks, ...rule.checks],
    drivingTrialIds: driving,
    sentences: groupSentences({
      setting,
      preparation,
      counts,
      success,
      ceiling,
      timeToConsumption,
      cautions,
      harmless: harmlessList,
      certainty,
      verdict,
      provisional: rule.verdict,
      because: rule.because,
    }),
    whatWouldChange: [],
  };
  if (opts.whatWouldChange) {
    derivation.whatWouldChange = groupWhatWouldChange(st, verdict);
    for (const w of derivation.whatWouldChange) derivation.sentences.push(w.text);
  }

  st.aggregate = {
    key: `${setting}/${preparation}`,
    setting,
    preparation,
    trialIds: trials.map((t) => t.id),
    counts,
    success,
    harm,
    ceiling,
    timeToConsumption,
    cautions,
    harmless: harmlessList,
    certainty,
    settled,
    provisionalVerdict: rule.verdict,
    verdict,
    label: verdictLabel(verdict),
    derivation,
  };
  return st;
}

function emptyGroupState(setting: Setting, preparation: Preparation): GroupState {
  return {
    setting,
    preparation,
    pooled: { loads: [], successes: [], weights: [] },
    finished: 0,
    consumed: 0,
    partial: 0,
    harm: 0,
    finishedContributors: 0,
    candidates: [ORDINARY_LOAD_KGM2],
    table: null,
    aggregate: null,
  };
}

function settingWhatWouldChange(
  states: readonly GroupState[],
  current: Verdict,
  finished: number,
  contributors: number,
): WhatWouldChange[] {
  const pool = states.slice();
  if (!pool.some((s) => s.preparation === BASELINE_PREPARATION)) pool.unshift(emptyGroupState(states[0].setting, BASELINE_PREPARATION));
  const base = pool.map((s) => ({ preparation: s.preparation, provisional: s.aggregate?.provisionalVerdict ?? null, finished: s.finished }));
  const out: WhatWouldChange[] = [];
  for (let ki = 0; ki < KINDS.length; ki++) {
    const kind = KINDS[ki];
    let best: Omit<WhatWouldChange, 'text'> | null = null;
    for (let k = 1; k <= MAX_HYPOTHETICAL_TRIALS && best === null; k++) {
      const settled = isSettled(finished + k, contributors + k);
      let bestHere: Omit<WhatWouldChange, 'text'> | null = null;
      for (let gi = 0; gi < pool.length; gi++) {
        const st = pool[gi];
        const table = buildTable(st);
        for (let li = 0; li < st.candidates.length; li++) {
          const groups = base.map((g, j) => (j === gi ? { ...g, provisional: table[ki][li][k - 1], finished: g.finished + k } : g));
          const r = settingVerdictRule(groups);
          const to: Verdict = settled && r.verdict !== null ? r.verdict : 'unsettled';
          if (!moves(kind, current, to)) continue;
          const cand = { kind, trials: k, loadKgM2: st.candidates[li], preparation: st.preparation, from: current, to };
          if (
            bestHere === null ||
            cand.loadKgM2 < bestHere.loadKgM2 ||
            (cand.loadKgM2 === bestHere.loadKgM2 && prepIndex(cand.preparation) < prepIndex(bestHere.preparation))
          ) {
            bestHere = cand;
          }
          break; // ascending loads: the first hit is the lowest for this group
        }
      }
      best = bestHere;
    }
    if (best) out.push({ ...best, text: whatWouldChangeText(best, 'setting') });
  }
  return out;
}

function buildSetting(setting: Setting, states: readonly GroupState[], trialsInSetting: readonly PreparedTrial[], opts: Required<AggregateOptions>): SettingVerdict {
  const groups = states.map((s) => s.aggregate as GroupAggregate);
  const finishedContributors = new Set<string>();
  let finished = 0;
  for (const t of trialsInSetting) {
    if (t.classification.outcome !== null) {
      finished++;
      finishedContributors.add(t.contributorId);
    }
  }
  const rule = settingVerdictRule(groups.map((g) => ({ preparation: g.preparation, provisional: g.provisionalVerdict, finished: g.counts.finished })));
  const settled = isSettled(finished, finishedContributors.size);
  const verdict: Verdict = settled && rule.verdict !== null ? rule.verdict : 'unsettled';
  const driver = rule.driver === null ? null : (groups.find((g) => g.preparation === rule.driver) as GroupAggregate);
  const counts = { trials: trialsInSetting.length, finished, finishedContributors: finishedContributors.size };
  const groupRows = groups.map((g) => ({ preparation: g.preparation, verdict: g.verdict, provisionalVerdict: g.provisionalVerdict }));
  const derivation: Derivation = {
    numbers: {
      trials: counts.trials,
      finished,
      finishedContributors: counts.finishedContributors,
      ceilingKgM2: driver ? driver.ceiling.kgM2 : null,
    },
    thresholds: [
      { rule: 'settled: finished trials', value: finished, threshold: MIN_FINISHED_TRIALS, comparison: '>=', met: finished >= MIN_FINISHED_TRIALS },
      {
        rule: 'settled: independent contributors',
        value: counts.finishedContributors,
        threshold: MIN_CONTRIBUTORS,
        comparison: '>=',
        met: counts.finishedContributors >= MIN_CONTRIBUTORS,
      },
    ],
    drivingTrialIds: driver ? driver.derivation.drivingTrialIds : [],
    sentences: settingSentences({
      setting,
      verdict,
      provisional: rule.verdict,
      driver: rule.driver,
      groups: groups.map((g) => ({ preparation: g.preparation, verdict: g.verdict, provisionalVerdict: g.provisionalVerdict, finished: g.counts.finished })),
      counts,
      ceilingKgM2: driver ? driver.ceiling.kgM2 : null,
      certainty: driver ? driver.certainty : null,
    }),
    whatWouldChange: [],
  };
  if (opts.whatWouldChange) {
    derivation.whatWouldChange = settingWhatWouldChange(states, verdict, finished, finishedContributors.size);
    for (const w of derivation.whatWouldChange) derivation.sentences.push(w.text);
  }
  return {
    setting,
    verdict,
    label: verdictLabel(verdict),
    settled,
    provisionalVerdict: rule.verdict,
    drivenBy: driver ? { preparation: driver.preparation, key: driver.key } : null,
    ceiling: { kgM2: driver ? driver.ceiling.kgM2 : null, preparation: driver ? driver.preparation : null },
    certainty: driver ? driver.certainty : null,
    groups: groupRows,
    counts,
    derivation,
  };
}

/**
 * Evidence verdicts of one feedstock: one GroupAggregate per setting ×
 * preparation that has trials, and one SettingVerdict per setting that has
 * trials, plus RULES_VERSION. Deterministic and independent of trial order;
 * the output is plain JSON (no undefined, NaN or Infinity).
 * Throws RangeError on duplicate trial ids or any invalid trial (see prepareTrial).
 */
export function aggregateFeedstock(trials: readonly TrialInput[], opts: AggregateOptions = {}): FeedstockAggregate {
  const options: Required<AggregateOptions> = { whatWouldChange: opts.whatWouldChange ?? true };
  const prepared = trials.map(prepareTrial);
  prepared.sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  for (let i = 1; i < prepared.length; i++) {
    if (prepared[i].id === prepared[i - 1].id) throw new RangeError(`duplicate trial id ${prepared[i].id}`);
  }
  // Buckets by setting × preparation in output order; each keeps id order.
  const np = PREPARATION_ORDER.length;
  const buckets: PreparedTrial[][] = Array.from({ length: SETTING_ORDER.length * np }, () => []);
  const bySetting: PreparedTrial[][] = SETTING_ORDER.map(() => []);
  for (const t of prepared) {
    const si = SETTING_INDEX[t.setting];
    buckets[si * np + PREP_INDEX[t.preparation]].push(t);
    bySetting[si].push(t);
  }
  const states: GroupState[] = [];
  for (let b = 0; b < buckets.length; b++) {
    const list = buckets[b];
    if (list.length > 0) states.push(buildGroup(list[0].setting, list[0].preparation, list, options));
  }
  const settings: SettingVerdict[] = [];
  SETTING_ORDER.forEach((setting, si) => {
    const inSetting = states.filter((s) => s.setting === setting);
    if (inSetting.length > 0) settings.push(buildSetting(setting, inSetting, bySetting[si], options));
  });
  return { groups: states.map((s) => s.aggregate as GroupAggregate), settings, rulesVersion: RULES_VERSION };
}
