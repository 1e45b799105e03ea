/**
 * Aggregation of one feedstock's trials per setting × preparation and per
 * setting. Deterministic and independent of input order: trials are sorted by
 * id (code-unit order) before anything else, and every statistic is computed
 * from integer counts.
 */
import { computeCautions } from './cautions';
import { ceilingEstimateFromPooled, hypotheticalCeiling, poolLoads, type PooledLoads } from './ceiling';
import { gradeCertainty } from './certainty';
import { groupSentences, settingSentences, whatWouldChangeText } from './derivation';
import { normaliseTrial, roundQuantity } from './normalise';
import { summariseTrialInto, type TrialSummary } from './outcome';
import { kaplanMeierFromTimes } from './survival';
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

/** A trial after normalisation and classification (the TrialSummary fields, flattened). */
export interface PreparedTrial extends TrialSummary {
  id: string;
  contributorId: string;
  setting: Setting;
  preparation: Preparation;
  status: TrialInput['status'];
  loadKgM2: number;
  hasControl: boolean;
  hasPhotos: boolean;
  hasCheckIns: boolean;
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
  const loadKgM2 = t.dose ? normalise(t).surfaceLoadKgM2 : fastLoad(t);
  const p: PreparedTrial = {
    id: t.id,
    contributorId: t.contributorId,
    setting: t.setting,
    preparation: t.preparation,
    status: t.status,
    loadKgM2,
    hasControl: t.hasControl,
    hasPhotos: t.photoCount > 0,
    hasCheckIns: false,
    outcome: null,
    eventMask: 0,
    daysToConsumption: null,
    followUpDays: null,
    springtails: false,
  };
  summariseInto(t, p);
  p.hasCheckIns = p.followUpDays !== null;
  return p;
}

/** Surface load entered directly: same validation and rounding as normaliseTrial, without its result object. */
function fastLoad(t: TrialInput): number {
  const x = t.surfaceLoadKgM2;
  if (typeof x === 'number' && x > 0 && x < Infinity && t.layerDepthCm == null && t.feedRatio == null) {
    const r = roundQuantity(x);
    if (r > 0) return r;
  }
  return normalise(t).surfaceLoadKgM2; // throws the proper RangeError for bad input
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
  /** [kind][loadIndex][k-1] → provisional verdict after adding k trials (undefined until computed). */
  table: (GroupVerdict | null | undefined)[][][] | null;
  aggregate: GroupAggregate | null;
}

const KINDS = ['consumed', 'harm'] as const;

const SETTING_INDEX: Record<string, number> = Object.fromEntries(SETTING_ORDER.map((s, i) => [s, i]));
const PREP_INDEX: Record<string, number> = Object.fromEntries(PREPARATION_ORDER.map((p, i) => [p, i]));
const normalise = normaliseTrial;
const summariseInto = summariseTrialInto;

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

/** Provisional verdict after k hypothetical trials, computed on first use and kept (the search stops early). */
function tableEntry(st: GroupState, ki: number, li: number, k: number): GroupVerdict | null {
  if (!st.table) {
    st.table = KINDS.map(() => st.candidates.map(() => new Array<GroupVerdict | null | undefined>(MAX_HYPOTHETICAL_TRIALS).fill(undefined)));
  }
  const row = st.table[ki][li];
  let v = row[k - 1];
  if (v === undefined) {
    v = hypotheticalProvisional(st, KINDS[ki], st.candidates[li], k);
    row[k - 1] = v;
  }
  return v;
}

function moves(kind: (typeof KINDS)[number], from: Verdict, to: Verdict): boolean {
  if (from === 'unsettled') return to !== 'unsettled';
  if (to === 'unsettled') return false;
  const d = compareVerdicts(to, from) as number;
  return kind === 'consumed' ? d > 0 : d < 0;
}

/**
 * Smallest k in 1..MAX_HYPOTHETICAL_TRIALS for which `verdictAt(k)` moves the
 * verdict in the direction of `kind`, or null. The rules are monotone in k
 * (more consumed trials never worsen, more harm trials never improve, and
 * settling only grows with k — the property tests hold this), so k = MAX is
 * tried first and a binary search finds the smallest: at most 4 evaluations.
 */
function firstMovingK(kind: (typeof KINDS)[number], current: Verdict, verdictAt: (k: number) => Verdict): { k: number; to: Verdict } | null {
  if (!moves(kind, current, verdictAt(MAX_HYPOTHETICAL_TRIALS))) return null;
  let lo = 1;
  let hi = MAX_HYPOTHETICAL_TRIALS;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (moves(kind, current, verdictAt(mid))) hi = mid;
    else lo = mid + 1;
  }
  return { k: lo, to: verdictAt(lo) };
}

/** A kind worth searching: a feed verdict cannot improve and an avoid verdict cannot get worse. */
function searchable(kind: (typeof KINDS)[number], current: Verdict): boolean {
  return !(kind === 'consumed' && current === 'feed') && !(kind === 'harm' && current === 'avoid');
}

/** Better of two candidate changes: fewer trials, then the lower load, then the earlier preparation. */
function preferred(a: Omit<WhatWouldChange, 'text'> | null, b: Omit<WhatWouldChange, 'text'>): Omit<WhatWouldChange, 'text'> {
  if (a === null) return b;
  if (b.trials !== a.trials) return b.trials < a.trials ? b : a;
  if (b.loadKgM2 !== a.loadKgM2) return b.loadKgM2 < a.loadKgM2 ? b : a;
  return prepIndex(b.preparation) < prepIndex(a.preparation) ? b : a;
}

function groupWhatWouldChange(st: GroupState, current: Verdict): WhatWouldChange[] {
  const out: WhatWouldChange[] = [];
  KINDS.forEach((kind, ki) => {
    if (!searchable(kind, current)) return;
    let best: Omit<WhatWouldChange, 'text'> | null = null;
    for (let li = 0; li < st.candidates.length; li++) {
      const hit = firstMovingK(kind, current, (k) => {
        const prov = tableEntry(st, ki, li, k);
        return isSettled(st.finished + k, st.finishedContributors + k) && prov !== null ? prov : 'unsettled';
      });
      if (hit) best = preferred(best, { kind, trials: hit.k, loadKgM2: st.candidates[li], preparation: st.preparation, from: current, to: hit.to });
    }
    if (best) out.push({ ...best, text: whatWouldChangeText(best, 'group') });
  });
  return out;
}

function buildGroup(setting: Setting, preparation: Preparation, trials: readonly PreparedTrial[], opts: Required<AggregateOptions>): GroupState {
  const contributors = new Set<string>();
  const finishedContributors = new Set<string>();
  // first pass: sizes of the typed arrays
  let finished = 0;
  let consumed = 0;
  let followed = 0;
  let events = 0;
  for (const t of trials) {
    const c = t;
    if (c.outcome !== null) {
      finished++;
      if (c.outcome === 'consumed') consumed++;
    }
    if (c.followUpDays !== null) {
      followed++;
      if (c.daysToConsumption !== null) events++;
    }
  }
  const allLoads = new Float64Array(finished);
  const successLoads = new Float64Array(consumed);
  const eventTimes = new Float64Array(events);
  const censorTimes = new Float64Array(followed - events);
  let fi = 0;
  let si = 0;
  let ei = 0;
  let ci = 0;
  let springtails = 0;
  let running = 0;
  let closed = 0;
  let partial = 0;
  let rejected = 0;
  let harmCount = 0;
  let withControl = 0;
  let withPhotos = 0;
  for (const t of trials) {
    contributors.add(t.contributorId);
    if (t.status === 'running') running++;
    else if (t.status === 'closed') closed++;
    const c = t;
    const o: Outcome | null = c.outcome;
    if (o !== null) {
      if (o === 'consumed') successLoads[si++] = t.loadKgM2;
      else if (o === 'partial') partial++;
      else if (o === 'rejected') rejected++;
      else harmCount++;
      allLoads[fi++] = t.loadKgM2;
      finishedContributors.add(t.contributorId);
      if (t.hasControl) withControl++;
      if (t.hasPhotos) withPhotos++;
    }
    if (c.followUpDays !== null) {
      if (c.daysToConsumption !== null) eventTimes[ei++] = c.daysToConsumption;
      else censorTimes[ci++] = c.followUpDays;
    }
    if (c.springtails) springtails++;
  }
  const counts: GroupCounts = {
    trials: trials.length,
    finished,
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
  const pooled = poolLoads(allLoads, successLoads);
  const ceiling = ceilingEstimateFromPooled(pooled, (x) =>
    trials.filter((t) => t.outcome !== null && t.loadKgM2 === x).map((t) => t.id),
  );
  const timeToConsumption = kaplanMeierFromTimes(eventTimes, censorTimes);
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

  const finishedPick = (t: PreparedTrial) => t.outcome !== null;
  let driving: string[];
  const prov = rule.verdict;
  if (verdict === 'unsettled' || prov === null) driving = firstIds(trials, finishedPick);
  else if (prov === 'avoid') driving = firstIds(trials, (t) => t.outcome === 'harm' || t.outcome === 'rejected');
  else if (prov === 'feed') driving = firstIds(trials, (t) => t.outcome === 'consumed');
  else {
    const c = ceiling.kgM2;
    driving = firstIds(trials, (t) =>
      c === null
        ? t.outcome !== null && t.outcome !== 'consumed'
        : t.outcome !== null && (t.loadKgM2 === c || (t.loadKgM2 > c && t.outcome !== 'consumed')),
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
    if (!searchable(kind, current)) continue;
    let best: Omit<WhatWouldChange, 'text'> | null = null;
    for (let gi = 0; gi < pool.length; gi++) {
      const st = pool[gi];
      for (let li = 0; li < st.candidates.length; li++) {
        const hit = firstMovingK(kind, current, (k) => {
          const groups = base.map((g, j) => (j === gi ? { ...g, provisional: tableEntry(st, ki, li, k), finished: g.finished + k } : g));
          const r = settingVerdictRule(groups);
          return isSettled(finished + k, contributors + k) && r.verdict !== null ? r.verdict : 'unsettled';
        });
        if (hit) best = preferred(best, { kind, trials: hit.k, loadKgM2: st.candidates[li], preparation: st.preparation, from: current, to: hit.to });
      }
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
    if (t.outcome !== null) {
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
