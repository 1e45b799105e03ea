import { describe, expect, it } from 'vitest';
import { aggregateFeedstock, RULES_VERSION, type TrialInput, type WhatWouldChange } from '@/lib/evidence';
import { checkIn, trial, trialWith } from './helpers';

function feedGroup(prefix: string, n: number, load = 3, extra: Partial<Parameters<typeof trial>[0]> = {}): TrialInput[] {
  return Array.from({ length: n }, (_, i) => trialWith('consumed', { id: `${prefix}${i}`, contributorId: `k${i % 3}`, load, ...extra }));
}

describe('aggregateFeedstock', () => {
  it('groups by setting × preparation in a fixed order with a rules version', () => {
    // PRODUCT.md "The computation" step 3 (per feedstock × setting × preparation); project rule: SETTING_ORDER, PREPARATION_ORDER, RULES_VERSION
    const r = aggregateFeedstock([
      ...feedGroup('a', 2, 3, { setting: 'bed', preparation: 'pre-composted' }),
      ...feedGroup('b', 2, 3, { setting: 'bin', preparation: 'raw' }),
      ...feedGroup('c', 2, 3, { setting: 'bed', preparation: 'raw' }),
    ]);
    expect(r.rulesVersion).toBe(RULES_VERSION);
    expect(r.groups.map((g) => g.key)).toEqual(['bin/raw', 'bed/raw', 'bed/pre-composted']);
    expect(r.settings.map((s) => s.setting)).toEqual(['bin', 'bed']);
  });

  it('a settled feed group explains itself', () => {
    // PRODUCT.md "The computation" steps 3–4; project rules in thresholds.ts (feed: ceiling ≥ 2 kg/m², Wilson lower bound ≥ 0.5, harm ≤ 10 %)
    const trials = feedGroup('t', 5, 3);
    trials.push(trialWith('consumed', { id: 't9', status: 'running', checkIns: [checkIn(7, { shareRemainingPct: 60 })] }));
    const r = aggregateFeedstock(trials);
    const g = r.groups[0];
    expect(g.verdict).toBe('feed');
    expect(g.label).toBe('Feed freely');
    expect(g.counts).toMatchObject({ trials: 6, finished: 5, running: 1, consumed: 5, finishedContributors: 3 });
    expect(g.trialIds).toEqual(['t0', 't1', 't2', 't3', 't4', 't9']);
    expect(g.derivation.sentences[0]).toBe(
      'Raw, in open beds: 5 of 5 finished trials were consumed within 28 days (100%; 95% interval 57%–100%) (1 more still open).',
    );
    expect(g.derivation.sentences).toContain('Consumed reliably at every tested load, up to 3 kg/m² (fitted consumed share at least 80%).');
    expect(g.derivation.sentences.some((s) => s.startsWith('Feed freely: consumed reliably up to 3 kg/m²'))).toBe(true);
    expect(g.derivation.thresholds.every((t) => typeof t.met === 'boolean')).toBe(true);
    expect(g.derivation.drivingTrialIds).toEqual(['t0', 't1', 't2', 't3', 't4']);
    // the running trial is censored in Kaplan–Meier, not dropped
    expect(g.timeToConsumption.n).toBe(6);
    expect(g.timeToConsumption.censored).toBe(1);
    expect(g.timeToConsumption.median).toBe(14);
    // a harm trial would move it down
    expect(g.derivation.whatWouldChange.map((w) => w.kind)).toEqual(['harm']);
  });

  it('setting words in sentences', () => {
    // project wording (brief): bin → "in enclosed bins", flow-through → "in flow-through systems", bed → "in open beds"
    const r = aggregateFeedstock([
      ...feedGroup('a', 1, 3, { setting: 'bin' }),
      ...feedGroup('b', 1, 3, { setting: 'flow-through' }),
      ...feedGroup('c', 1, 3, { setting: 'bed' }),
    ]);
    expect(r.groups.map((g) => g.derivation.sentences[0].split(':')[0])).toEqual([
      'Raw, in enclosed bins',
      'Raw, in flow-through systems',
      'Raw, in open beds',
    ]);
    expect(r.settings[0].derivation.sentences[0].startsWith('In enclosed bins:')).toBe(true);
  });

  it('unsettled with too few trials, with the rules-alone verdict named', () => {
    // PRODUCT.md vocabulary: unsettled = too few independent trials; project rule MIN_FINISHED_TRIALS = 3, MIN_CONTRIBUTORS = 2
    const r = aggregateFeedstock(feedGroup('u', 2, 3, { contributorId: 'same' }));
    const g = r.groups[0];
    expect(g.verdict).toBe('unsettled');
    expect(g.label).toBe('Not enough evidence');
    expect(g.provisionalVerdict).toBe('limit');
    expect(g.derivation.sentences.some((s) => s.includes('a verdict needs 3 finished trials by 2 keepers'))).toBe(true);
    // one more consumed trial from another keeper settles it
    const w = g.derivation.whatWouldChange.find((x) => x.kind === 'consumed') as WhatWouldChange;
    expect(w.trials).toBe(1);
    expect(w.to).not.toBe('unsettled');
    // tie-break (aggregate.ts preferred): candidates 2 and 3 kg/m² both need one trial → the lower load
    expect(w.loadKgM2).toBe(2);
    expect(w.text).toContain('from other keepers');
    expect(r.settings[0].verdict).toBe('unsettled');
  });

  it('raw keeps out but pre-composted feeds freely → prepare, driven by the pre-composted group', () => {
    // PRODUCT.md vocabulary: prepare = fine only after a preparation step; project rule settingVerdictRule
    const raw = Array.from({ length: 4 }, (_, i) => trialWith('harm', { id: `r${i}`, contributorId: `k${i}`, load: 2 }));
    const pre = feedGroup('p', 5, 3, { preparation: 'pre-composted' });
    const r = aggregateFeedstock([...raw, ...pre]);
    const bed = r.settings[0];
    expect(r.groups.map((g) => [g.preparation, g.verdict])).toEqual([
      ['raw', 'avoid'],
      ['pre-composted', 'feed'],
    ]);
    expect(bed.verdict).toBe('prepare');
    expect(bed.label).toBe('Prepare first');
    expect(bed.drivenBy).toEqual({ preparation: 'pre-composted', key: 'bed/pre-composted' });
    expect(bed.ceiling).toEqual({ kgM2: 3, preparation: 'pre-composted' });
    expect(bed.certainty?.grade).toBe(r.groups[1].certainty.grade);
    expect(bed.derivation.sentences[0]).toBe('In open beds: raw: Keep out (4 trials finished); pre-composted: Feed freely (5 trials finished).');
    expect(bed.derivation.sentences[1]).toBe('Prepare first: raw material does not do well enough, but pre-composted material reads Feed freely.');
    expect(r.groups[0].derivation.drivingTrialIds).toEqual(['r0', 'r1', 'r2', 'r3']);
    // what would change the setting: raw would need more than five consumed trials (cap), so no upward change is named;
    // three harm trials of pre-composted material at 2 kg/m² would make it Keep out
    expect(bed.derivation.whatWouldChange.find((w) => w.kind === 'consumed')).toBeUndefined();
    const down = bed.derivation.whatWouldChange.find((w) => w.kind === 'harm') as WhatWouldChange;
    expect(down).toMatchObject({ preparation: 'pre-composted', trials: 3, loadKgM2: 2, to: 'avoid' });
    expect(down.text).toBe('Three more pre-composted trials with harm at 2 kg/m² would move this setting to Keep out.');
  });

  it('"what would change it" is honest: adding the named trials gives the named verdict', () => {
    // PRODUCT.md "The computation" step 4: what would change it, computed by re-running the rules
    const base = [
      ...feedGroup('a', 3, 1),
      trialWith('partial', { id: 'z1', contributorId: 'k9', load: 5 }),
      trialWith('consumed', { id: 'z2', contributorId: 'k8', load: 1 }),
    ];
    const before = aggregateFeedstock(base);
    const g = before.groups[0];
    expect(g.verdict).toBe('limit');
    const w = g.derivation.whatWouldChange.find((x) => x.kind === 'consumed') as WhatWouldChange;
    expect(w).toBeDefined();
    expect(w.text).toMatch(/^(One|Two|Three|Four|Five) more consumed trials? at [\d.]+ kg\/m² would move it to /);
    const added = Array.from({ length: w.trials }, (_, i) =>
      trialWith('consumed', { id: `hyp${i}`, contributorId: `new${i}`, load: w.loadKgM2 }),
    );
    expect(aggregateFeedstock([...base, ...added]).groups[0].verdict).toBe(w.to);
    // and one fewer is not enough
    if (w.trials > 1) expect(aggregateFeedstock([...base, ...added.slice(1)]).groups[0].verdict).toBe(g.verdict);
    const h = g.derivation.whatWouldChange.find((x) => x.kind === 'harm') as WhatWouldChange;
    if (h) {
      const harms = Array.from({ length: h.trials }, (_, i) => trialWith('harm', { id: `bad${i}`, contributorId: `new${i}`, load: h.loadKgM2 }));
      expect(aggregateFeedstock([...base, ...harms]).groups[0].verdict).toBe(h.to);
    }
  });

  it('the search is capped at five hypothetical trials', () => {
    // project rule: MAX_HYPOTHETICAL_TRIALS = 5 — a verdict that needs more says nothing rather than blowing up
    const base = [...feedGroup('a', 6, 2), ...Array.from({ length: 6 }, (_, i) => trialWith('partial', { id: `p${i}`, contributorId: `q${i}`, load: 15 }))];
    const g = aggregateFeedstock(base).groups[0];
    expect(g.verdict).toBe('limit');
    for (const w of g.derivation.whatWouldChange) expect(w.trials).toBeLessThanOrEqual(5);
  });

  it('output is plain JSON: no undefined, NaN or Infinity', () => {
    // project rule (brief): JSON-serialisable output, null for missing values
    const trials = [
      ...feedGroup('a', 3, 2),
      trialWith('harm', { id: 'h', load: 9 }),
      trial({ id: 'empty', status: 'running', checkIns: [] }),
      trialWith('rejected', { id: 'r', load: 4, setting: 'bin', preparation: 'aged' }),
    ];
    const r = aggregateFeedstock(trials);
    expect(JSON.parse(JSON.stringify(r))).toStrictEqual(r);
  });

  it('throws on duplicate ids and invalid trials', () => {
    // project rule: invalid input is a RangeError
    expect(() => aggregateFeedstock([trialWith('consumed', { id: 'x' }), trialWith('consumed', { id: 'x' })])).toThrow(RangeError);
    expect(() => aggregateFeedstock([{ ...trial({ id: 'x' }), setting: 'pot' as never }])).toThrow(RangeError);
    expect(() => aggregateFeedstock([{ ...trial({ id: 'x' }), preparation: 'fried' as never }])).toThrow(RangeError);
    expect(() => aggregateFeedstock([{ ...trial({ id: 'x' }), photoCount: -1 }])).toThrow(RangeError);
    expect(() => aggregateFeedstock([{ ...trial({ id: '' }) }])).toThrow(RangeError);
    expect(() => aggregateFeedstock([{ ...trial({ id: 'x' }), surfaceLoadKgM2: null }])).toThrow(RangeError);
  });

  it('no trials: empty result', () => {
    // project rule: settings and groups appear only when they have trials
    expect(aggregateFeedstock([])).toStrictEqual({ groups: [], settings: [], rulesVersion: RULES_VERSION });
  });

  it('whatWouldChange can be switched off', () => {
    // project option AggregateOptions.whatWouldChange
    const r = aggregateFeedstock(feedGroup('a', 5, 3), { whatWouldChange: false });
    expect(r.groups[0].derivation.whatWouldChange).toEqual([]);
    expect(r.settings[0].derivation.whatWouldChange).toEqual([]);
  });

  it('cautions and harmless residents appear in the derivation', () => {
    // PRODUCT.md step 3 (cautions with frequencies); TRADE §5 springtails harmless (from memory); REFERENCES §9 common practice
    const trials = [
      ...feedGroup('a', 3, 2),
      trialWith('partial', { id: 'h1', load: 8, checkIns: [checkIn(7, { bedTempC: 33, shareRemainingPct: 80, pests: ['springtails'] }), checkIn(21, { shareRemainingPct: 40 })] }),
    ];
    const g = aggregateFeedstock(trials).groups[0];
    expect(g.cautions[0].text).toBe('Heating (above 30 °C) in 1 of 4 trials, all above 2 kg/m²');
    expect(g.harmless).toEqual([{ pest: 'springtails', trials: 1 }]);
    expect(g.derivation.sentences).toContain('Heating (above 30 °C) in 1 of 4 trials, all above 2 kg/m².');
    expect(g.derivation.sentences).toContain('Springtails seen in 1 trial (harmless decomposers, not counted as a problem).');
  });

  it('inconsistency tie: a fitted share of exactly 0.5 predicts consumed', () => {
    // project rule: FIT_PREDICTS_CONSUMED = 0.5, ties predict consumed → the partial trial disagrees, the consumed one does not
    const g = aggregateFeedstock([trialWith('consumed', { id: 'a', load: 2 }), trialWith('partial', { id: 'b', load: 2 })]).groups[0];
    expect(g.ceiling.blocks).toEqual([{ fromKgM2: 2, toKgM2: 2, fitted: 0.5, weight: 2 }]);
    expect(g.derivation.numbers.disagreementsWithLoadPattern).toBe(1);
  });

  it('at most 20 driving trial ids, the first by id', () => {
    // project rule: DRIVING_TRIAL_LIMIT = 20
    const g = aggregateFeedstock(feedGroup('d', 25, 3)).groups[0];
    expect(g.derivation.drivingTrialIds).toHaveLength(20);
    expect(g.derivation.drivingTrialIds[0]).toBe('d0');
    expect(g.trialIds).toHaveLength(25);
  });

  it('trials are ordered by id in code-unit order (not locale order)', () => {
    // project rule (aggregate.ts): deterministic sort independent of locale — 'B' < 'a', 'a10' < 'a9'
    const g = aggregateFeedstock([trialWith('consumed', { id: 'a9' }), trialWith('consumed', { id: 'a10' }), trialWith('consumed', { id: 'B1' })]).groups[0];
    expect(g.trialIds).toEqual(['B1', 'a10', 'a9']);
  });

  it('hypothetical loads come from the tested loads and the ordinary load, at most four', () => {
    // project rule: MAX_HYPOTHETICAL_LOADS = 4 candidates from {next load above the ceiling, ceiling, 2 kg/m², lowest, highest}
    const trials = [...feedGroup('a', 3, 1), trialWith('partial', { id: 'p1', contributorId: 'x', load: 5 }), trialWith('partial', { id: 'p2', contributorId: 'y', load: 9 })];
    const g = aggregateFeedstock(trials).groups[0];
    const allowed = new Set([1, 5, 9, 2]);
    for (const w of g.derivation.whatWouldChange) expect(allowed.has(w.loadKgM2)).toBe(true);
  });
});
