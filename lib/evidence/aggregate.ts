/**
 * Aggregation of one feedstock's trials per setting × preparation and per
 * setting. Deterministic and independent of input order: trials are sorted by
 * id (code-unit order) before anything else, and every statistic is computed
 * from integer counts.
 */
import { computeCautions } from './cautions';
import { byString, ceilingEstimateFromPooled, ceilingFromPooled, poolByLoad, withExtraTrials, type PooledLoads } from './ceiling';
import { gradeCertainty } from './certainty';
import { groupSentences, settingSentences, whatWouldChangeText } from './derivation';
import { normaliseTrial } from './normalise';
import { classifyTrial } from './outcome';
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
  TrialClassification,
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
  classification: TrialClassification;
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
  if (!SETTING_ORDER.includes(t.setting)) throw new RangeError(`trial ${t.id}: unknown setting ${String(t.setting)}`);
  if (!PREPARATION_ORDER.includes(t.preparation)) throw new RangeError(`trial ${t.id}: unknown preparation ${String(t.preparation)}`);
  if (!Number.isInteger(t.photoCount) || t.photoCount < 0) throw new RangeError(`trial ${t.id}: photoCount must be a whole number ≥ 0`);
  if (typeof t.hasControl !== 'boolean') throw new RangeError(`trial ${t.id}: hasControl must be true or false`);
  const loads = normaliseTrial(t);
  return {
    id: t.id,
    contributorId: t.contributorId,
    setting: t.setting,
    preparation: t.preparation,
    status: t.status,
    loadKgM2: loads.surfaceLoadKgM2,
    hasControl: t.hasControl,
    hasPhotos: t.photoCount > 0,
    classification: classifyTrial(t),
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

function settingIndex(s: Setting): number {
  return SETTING_ORDER.indexOf(s);
}
function prepIndex(p: Preparation): number {
  return PREPARATION_ORDER.indexOf(p);
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
  const pooled = withExtraTrials(st.pooled, load, kind === 'consumed' ? k : 0, k);
  const core = ceilingFromPooled(pooled);
  const finished = st.finished + k;
  const consumed = st.consumed + (kind === 'consumed' ? k : 0);
  const harm = st.harm + (kind === 'harm' ? k : 0);
  return groupVerdictRule({
    finished,
    consumed,
    partial: st.partial,
    harm,
    successLower: wilson(consumed, finished).lower,
    ceilingKgM2: core.kgM2,
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
  const counts: GroupCounts = {
    trials: trials.length,
    finished: 0,
    running: 0,
    closed: 0,
    abandoned: 0,
    consumed: 0,
    partial: 0,
    rejected: 0,
    harm: 0,
    contributors: 0,
    finishedContributors: 0,
    withControl: 0,
    withPhotos: 0,
  };
  const contributors = new Set<string>();
  const finishedContributors = new Set<string>();
  const points: { id: string; loadKgM2: number; success: boolean }[] = [];
  const km: SurvivalObservation[] = [];
  const harmless = new Map<Pest, number>();
  const cautionTrials = [];
  for (const t of trials) {
    contributors.add(t.contributorId);
    counts[t.status]++;
    const c = t.classification;
    const o: Outcome | null = c.outcome;
    if (o !== null) {
      counts.finished++;
      counts[o]++;
      finishedContributors.add(t.contributorId);
      if (t.hasControl) counts.withControl++;
      if (t.hasPhotos) counts.withPhotos++;
      points.push({ id: t.id, loadKgM2: t.loadKgM2, success: o === 'consumed' });
    }
    if (c.followUpDays !== null) {
      km.push(c.daysToConsumption !== null ? { time: c.daysToConsumption, event: true } : { time: c.followUpDays, event: false });
    }
    for (const h of c.harmless) harmless.set(h, (harmless.get(h) ?? 0) + 1);
    cautionTrials.push({
      id: t.id,
      loadKgM2: t.loadKgM2,
      events: c.adverseEvents.map((e) => e.event),
      hasCheckIns: c.followUpDays !== null,
    });
  }
  counts.contributors = contributors.size;
  counts.finishedContributors = finishedContributors.size;

  const success = proportionEstimate(counts.consumed, counts.finished);
  const harm = proportionEstimate(counts.harm, counts.finished);
  const pooled = poolByLoad(points);
  const ceiling = ceilingEstimateFromPooled(pooled, points);
  const timeToConsumption = kaplanMeier(km);
  const cautions = computeCautions(cautionTrials);

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

  const harmlessList = [...harmless.entries()].sort((a, b) => byString(a[0], b[0])).map(([pest, n]) => ({ pest, trials: n }));
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
  prepared.sort((a, b) => byString(a.id, b.id));
  for (let i = 1; i < prepared.length; i++) {
    if (prepared[i].id === prepared[i - 1].id) throw new RangeError(`duplicate trial id ${prepared[i].id}`);
  }
  const byGroup = new Map<string, PreparedTrial[]>();
  const bySetting = new Map<Setting, PreparedTrial[]>();
  for (const t of prepared) {
    const key = `${t.setting}/${t.preparation}`;
    let g = byGroup.get(key);
    if (!g) byGroup.set(key, (g = []));
    g.push(t);
    let s = bySetting.get(t.setting);
    if (!s) bySetting.set(t.setting, (s = []));
    s.push(t);
  }
  const keys = [...byGroup.keys()].sort((a, b) => {
    const [sa, pa] = a.split('/') as [Setting, Preparation];
    const [sb, pb] = b.split('/') as [Setting, Preparation];
    return settingIndex(sa) - settingIndex(sb) || prepIndex(pa) - prepIndex(pb);
  });
  const states = keys.map((key) => {
    const list = byGroup.get(key) as PreparedTrial[];
    return buildGroup(list[0].setting, list[0].preparation, list, options);
  });
  const settings: SettingVerdict[] = [];
  for (const setting of SETTING_ORDER) {
    const inSetting = states.filter((s) => s.setting === setting);
    if (inSetting.length === 0) continue;
    settings.push(buildSetting(setting, inSetting, bySetting.get(setting) as PreparedTrial[], options));
  }
  return { groups: states.map((s) => s.aggregate as GroupAggregate), settings, rulesVersion: RULES_VERSION };
}
