/**
 * Invariants from PRODUCT.md ("Invariants that tests hold"), as fast-check properties:
 * the result does not depend on trial order or on the units entered; adding a successful
 * trial never worsens a verdict or lowers a ceiling; adding a harm trial never improves
 * one; same input, same output.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  aggregateFeedstock,
  compareVerdicts,
  normaliseTrial,
  type CheckIn,
  type DoseEntry,
  type Outcome,
  type FeedstockAggregate,
  type Preparation,
  type Setting,
  type TrialInput,
  type WhatWouldChange,
} from '@/lib/evidence';
import { dateAfter } from './helpers';

const SETTINGS: Setting[] = ['bin', 'flow-through', 'bed'];
const PREPS: Preparation[] = ['raw', 'chopped', 'pre-composted'];

const checkInArb: fc.Arbitrary<CheckIn> = fc.record({
  day: fc.integer({ min: 0, max: 60 }),
  wormActivity: fc.constantFrom('none', 'few', 'many', 'swarming'),
  shareRemainingPct: fc.oneof(fc.integer({ min: 0, max: 100 }), fc.constantFrom(0, 5, 10, 11, 100)),
  bedTempC: fc.option(fc.double({ min: 0, max: 45, noNaN: true }), { nil: null }),
  mould: fc.boolean(),
  smell: fc.constantFrom('none', 'earthy', 'sour', 'rotten', 'ammonia'),
  moisture: fc.constantFrom('dry', 'damp', 'wet', 'waterlogged'),
  pH: fc.option(fc.double({ min: 3, max: 11, noNaN: true }), { nil: null }),
  pests: fc.subarray(['flatworms', 'mites', 'fruit-flies', 'fungus-gnats', 'ants', 'rodents', 'springtails'] as const, { maxLength: 2 }),
  // 1 in 20 check-ins reports deaths, 1 in 20 an exodus
  deathRoll: fc.integer({ min: 0, max: 19 }),
}).map(({ day, deathRoll, ...c }) => ({ ...c, pests: [...c.pests], date: dateAfter(day), wormDeaths: deathRoll === 0, exodus: deathRoll === 1 }));

const loadArb = fc.oneof(fc.constantFrom(0.5, 1, 2, 3, 6, 10, 15), fc.double({ min: 0.05, max: 30, noNaN: true }));

const quiet = (day: number, share: number, o: Partial<CheckIn> = {}): CheckIn => ({
  date: dateAfter(day),
  wormActivity: 'many',
  shareRemainingPct: share,
  bedTempC: 20,
  mould: false,
  smell: 'earthy',
  moisture: 'damp',
  pH: 7,
  pests: [],
  ...o,
});

/**
 * Check-ins shaped like each outcome, plus fully random ones, so that groups reach every verdict.
 * `profile` tilts a whole sample: 0 mostly consumed, 1 mixed, 2 mostly refused or harmful.
 */
const checkInsArb = (profile: number): fc.Arbitrary<CheckIn[]> =>
  fc.oneof(
    {
      weight: [30, 4, 1][profile],
      arbitrary: fc.tuple(fc.integer({ min: 1, max: 28 }), fc.integer({ min: 0, max: 10 })).map(([d, left]) => [quiet(0, 90, { wormActivity: 'few' }), quiet(d, left)]),
    },
    { weight: [1, 2, 2][profile], arbitrary: fc.integer({ min: 7, max: 60 }).map((d) => [quiet(3, 90, { wormActivity: 'few' }), quiet(d, 40)]) },
    { weight: [0, 1, 4][profile], arbitrary: fc.integer({ min: 7, max: 60 }).map((d) => [quiet(d, 100, { wormActivity: 'none', bedTempC: 34 })]) },
    { weight: [0, 1, 3][profile], arbitrary: fc.integer({ min: 0, max: 40 }).map((d) => [quiet(d, 80, { wormDeaths: true, smell: 'sour' })]) },
    { weight: [1, 2, 2][profile], arbitrary: fc.array(checkInArb, { maxLength: 4 }) },
  );

const trialBody = (profile: number) =>
  fc.record({
    contributorId: fc.constantFrom('k0', 'k1', 'k2', 'k3', 'k4'),
    setting: fc.constantFrom<Setting>('bed', 'bed', 'bed', 'bin', 'flow-through'),
    preparation: fc.constantFrom<Preparation>('raw', 'raw', 'raw', 'pre-composted', 'chopped'),
    status: fc.constantFrom('running', 'closed', 'closed', 'closed', 'abandoned'),
    surfaceLoadKgM2: loadArb,
    hasControl: fc.boolean(),
    photoCount: fc.integer({ min: 0, max: 3 }),
    // the owner confirms an outcome on about 1 trial in 9
    outcomeOverride: fc.oneof(
      { weight: 8, arbitrary: fc.constant(null) },
      { weight: 1, arbitrary: fc.constantFrom<Outcome>('consumed', 'partial', 'rejected', 'harm') },
    ),
    checkIns: checkInsArb(profile),
  });

const trialsArb: fc.Arbitrary<TrialInput[]> = fc
  .integer({ min: 0, max: 2 })
  .chain((profile) => fc.array(trialBody(profile), { maxLength: 30, size: 'max' }))
  .map((bodies) => bodies.map((b, i) => ({ ...b, id: `t${String(i).padStart(2, '0')}`, startDate: '2024-05-01' }) as TrialInput));

/** A consumed trial with no adverse events. */
const consumedTrialArb = fc
  .record({
    contributorId: fc.constantFrom('k0', 'k1', 'k5', 'k6'),
    setting: fc.constantFrom(...SETTINGS),
    preparation: fc.constantFrom(...PREPS),
    status: fc.constantFrom('closed', 'running'),
    surfaceLoadKgM2: loadArb,
    hasControl: fc.boolean(),
    photoCount: fc.integer({ min: 0, max: 3 }),
    firstDay: fc.integer({ min: 1, max: 14 }),
    doneDay: fc.integer({ min: 15, max: 28 }),
    left: fc.integer({ min: 0, max: 10 }),
    temp: fc.double({ min: 10, max: 30, noNaN: true }),
    viaOwner: fc.boolean(),
  })
  .map(
    (r): TrialInput => ({
      id: 'zz-added',
      contributorId: r.contributorId,
      setting: r.setting,
      preparation: r.preparation,
      status: r.status,
      startDate: '2024-05-01',
      surfaceLoadKgM2: r.surfaceLoadKgM2,
      hasControl: r.hasControl,
      photoCount: r.photoCount,
      outcomeOverride: r.viaOwner ? 'consumed' : null,
      checkIns: [
        { date: dateAfter(r.firstDay), wormActivity: 'few', shareRemainingPct: 60, bedTempC: r.temp, mould: false, smell: 'earthy', moisture: 'damp', pH: 7, pests: [] },
        { date: dateAfter(r.doneDay), wormActivity: 'many', shareRemainingPct: r.left, bedTempC: r.temp, mould: false, smell: 'none', moisture: 'wet', pH: 6.5, pests: ['springtails'] },
      ],
    }),
  );

/** A trial with worm deaths or an exodus. */
const harmTrialArb = fc
  .record({
    contributorId: fc.constantFrom('k0', 'k1', 'k5', 'k6'),
    setting: fc.constantFrom(...SETTINGS),
    preparation: fc.constantFrom(...PREPS),
    status: fc.constantFrom('closed', 'running', 'abandoned'),
    surfaceLoadKgM2: loadArb,
    hasControl: fc.boolean(),
    photoCount: fc.integer({ min: 0, max: 3 }),
    day: fc.integer({ min: 0, max: 40 }),
    exodus: fc.boolean(),
    share: fc.integer({ min: 0, max: 100 }),
    viaOwner: fc.boolean(),
  })
  .map(
    (r): TrialInput => ({
      id: 'zz-added',
      contributorId: r.contributorId,
      setting: r.setting,
      preparation: r.preparation,
      status: r.status,
      startDate: '2024-05-01',
      surfaceLoadKgM2: r.surfaceLoadKgM2,
      hasControl: r.hasControl,
      photoCount: r.photoCount,
      outcomeOverride: r.viaOwner ? 'harm' : null,
      checkIns: [
        { date: dateAfter(r.day), wormActivity: 'few', shareRemainingPct: r.share, bedTempC: 33, mould: true, smell: 'sour', moisture: 'wet', pH: 5.5, pests: [], wormDeaths: !r.exodus, exodus: r.exodus },
      ],
    }),
  );

const NUM_RUNS = 80;

type Direction = 'not-worse' | 'not-better';

/** Checks every group and setting of `after` against `before` in one direction. */
function assertMonotone(before: FeedstockAggregate, after: FeedstockAggregate, dir: Direction): void {
  const ceilingRank = (x: number | null) => (x === null ? -Infinity : x);
  for (const g of before.groups) {
    const h = after.groups.find((x) => x.key === g.key);
    expect(h, g.key).toBeDefined();
    if (!h) continue;
    // settled never becomes unsettled when a finished trial is added
    if (g.verdict !== 'unsettled') expect(h.verdict, g.key).not.toBe('unsettled');
    const c = compareVerdicts(h.verdict, g.verdict);
    if (c !== null) {
      if (dir === 'not-worse') expect(c, `${g.key}: ${g.verdict} → ${h.verdict}`).toBeGreaterThanOrEqual(0);
      else expect(c, `${g.key}: ${g.verdict} → ${h.verdict}`).toBeLessThanOrEqual(0);
    }
    // provisional verdicts (rules alone) move the same way
    if (g.provisionalVerdict !== null && h.provisionalVerdict !== null) {
      const p = compareVerdicts(h.provisionalVerdict, g.provisionalVerdict) as number;
      if (dir === 'not-worse') expect(p).toBeGreaterThanOrEqual(0);
      else expect(p).toBeLessThanOrEqual(0);
    }
    if (dir === 'not-worse') expect(ceilingRank(h.ceiling.kgM2), `${g.key} ceiling`).toBeGreaterThanOrEqual(ceilingRank(g.ceiling.kgM2));
    else expect(ceilingRank(h.ceiling.kgM2), `${g.key} ceiling`).toBeLessThanOrEqual(ceilingRank(g.ceiling.kgM2));
  }
  for (const s of before.settings) {
    const t = after.settings.find((x) => x.setting === s.setting);
    expect(t).toBeDefined();
    if (!t) continue;
    if (s.verdict !== 'unsettled') expect(t.verdict).not.toBe('unsettled');
    const c = compareVerdicts(t.verdict, s.verdict);
    if (c !== null) {
      if (dir === 'not-worse') expect(c, `${s.setting}: ${s.verdict} → ${t.verdict}`).toBeGreaterThanOrEqual(0);
      else expect(c, `${s.setting}: ${s.verdict} → ${t.verdict}`).toBeLessThanOrEqual(0);
    }
  }
}

describe('evidence engine invariants (PRODUCT.md)', () => {
  it('does not depend on trial order (or check-in order)', () => {
    // PRODUCT.md "Invariants that tests hold": independent of trial order
    fc.assert(
      fc.property(trialsArb, fc.array(fc.integer(), { minLength: 30, maxLength: 30 }), (trials, keys) => {
        const a = aggregateFeedstock(trials);
        const permuted = trials
          .map((t, i) => ({ t: { ...t, checkIns: t.checkIns.slice().reverse() }, k: keys[i] }))
          .sort((x, y) => x.k - y.k)
          .map((x) => x.t);
        expect(aggregateFeedstock(permuted)).toStrictEqual(a);
      }),
      { numRuns: NUM_RUNS },
    );
  });

  it('does not depend on the units entered (kg, g, lb, oz, volume with density; m² or ft²)', () => {
    // PRODUCT.md invariants: independent of units; REFERENCES §5 NIST factors
    fc.assert(
      fc.property(
        trialsArb,
        fc.array(fc.record({ density: fc.double({ min: 50, max: 1200, noNaN: true }), area: fc.double({ min: 0.05, max: 20, noNaN: true }) }), {
          minLength: 30,
          maxLength: 30,
        }),
        (trials, extras) => {
          const variants: ((kg: number, m2: number, rho: number) => DoseEntry)[] = [
            (kg, m2) => ({ dose: { amount: kg, unit: 'kg' }, area: { amount: m2, unit: 'm2' } }),
            (kg, m2) => ({ dose: { amount: kg * 1000, unit: 'g' }, area: { amount: m2 / 0.09290304, unit: 'ft2' } }),
            (kg, m2) => ({ dose: { amount: kg / 0.45359237, unit: 'lb' }, area: { amount: m2 / 0.09290304, unit: 'ft2' } }),
            (kg, m2) => ({ dose: { amount: (kg / 0.45359237) * 16, unit: 'oz' }, area: { amount: m2, unit: 'm2' } }),
            (kg, m2, rho) => ({ dose: { amount: (kg / rho) * 1000, unit: 'L' }, area: { amount: m2, unit: 'm2' }, bulkDensityKgM3: rho }),
            (kg, m2, rho) => ({ dose: { amount: (kg / rho) * 1000 / 3.785411784, unit: 'gal' }, area: { amount: m2 / 0.09290304, unit: 'ft2' }, bulkDensityKgM3: rho }),
            (kg, m2, rho) => ({ dose: { amount: kg / rho / 0.764554857984, unit: 'yd3' }, area: { amount: m2, unit: 'm2' }, bulkDensityKgM3: rho }),
          ];
          const results = variants.map((v) =>
            trials.map((t, i) => {
              const { surfaceLoadKgM2, ...rest } = t;
              const m2 = extras[i].area;
              return { ...rest, dose: v((surfaceLoadKgM2 as number) * m2, m2, extras[i].density) } as TrialInput;
            }),
          );
          const loads0 = results[0].map((t) => normaliseTrial(t).surfaceLoadKgM2);
          for (const r of results.slice(1)) {
            r.forEach((t, i) => {
              const x = normaliseTrial(t).surfaceLoadKgM2;
              expect(Math.abs(x - loads0[i])).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(loads0[i])));
            });
          }
          const agg0 = aggregateFeedstock(results[0]);
          for (const r of results.slice(1)) expect(aggregateFeedstock(r)).toStrictEqual(agg0);
        },
      ),
      { numRuns: 30 },
    );
  });

  it('an added consumed trial with no adverse events never worsens a verdict or lowers a ceiling', () => {
    // PRODUCT.md invariants: adding a successful trial never worsens a verdict or lowers a ceiling
    fc.assert(
      fc.property(trialsArb, consumedTrialArb, (trials, added) => {
        const before = aggregateFeedstock(trials, { whatWouldChange: false });
        const after = aggregateFeedstock([...trials, added], { whatWouldChange: false });
        const g = after.groups.find((x) => x.trialIds.includes('zz-added'));
        expect(g?.counts.consumed).toBe((before.groups.find((x) => x.key === g?.key)?.counts.consumed ?? 0) + 1);
        assertMonotone(before, after, 'not-worse');
      }),
      { numRuns: NUM_RUNS * 2 },
    );
  });

  it('an added harm trial never improves a verdict or raises a ceiling', () => {
    // PRODUCT.md invariants: adding a harm trial never improves a verdict
    fc.assert(
      fc.property(trialsArb, harmTrialArb, (trials, added) => {
        const before = aggregateFeedstock(trials, { whatWouldChange: false });
        const after = aggregateFeedstock([...trials, added], { whatWouldChange: false });
        assertMonotone(before, after, 'not-better');
      }),
      { numRuns: NUM_RUNS * 2 },
    );
  });

  it('focused: many consumed or harm trials added one by one to one group', () => {
    // a denser walk through the thresholds of one group
    fc.assert(
      fc.property(
        fc.array(fc.record({ harm: fc.boolean(), load: fc.constantFrom(0.5, 1, 2, 3, 6, 10), who: fc.integer({ min: 0, max: 3 }) }), { minLength: 1, maxLength: 25 }),
        (steps) => {
          let trials: TrialInput[] = [];
          let before = aggregateFeedstock(trials, { whatWouldChange: false });
          steps.forEach((s, i) => {
            const t: TrialInput = {
              id: `s${String(i).padStart(2, '0')}`,
              contributorId: `k${s.who}`,
              setting: 'bed',
              preparation: i % 2 === 0 ? 'raw' : 'aged',
              status: 'closed',
              startDate: '2024-05-01',
              surfaceLoadKgM2: s.load,
              hasControl: true,
              photoCount: 1,
              outcomeOverride: s.harm ? 'harm' : 'consumed',
              checkIns: [],
            };
            trials = [...trials, t];
            const after = aggregateFeedstock(trials, { whatWouldChange: false });
            assertMonotone(before, after, s.harm ? 'not-better' : 'not-worse');
            before = after;
          });
        },
      ),
      { numRuns: NUM_RUNS },
    );
  });

  it('"what would change it" is honest: the named trials give the named verdict, one fewer does not', () => {
    // PRODUCT.md step 4: what would change it — computed honestly by re-running the rules
    const hypothetical = (w: WhatWouldChange, setting: Setting, n: number): TrialInput[] =>
      Array.from({ length: n }, (_, i) => ({
        id: `zz-h${i}`,
        contributorId: `new-keeper-${i}`,
        setting,
        preparation: w.preparation,
        status: 'closed',
        startDate: '2024-05-01',
        surfaceLoadKgM2: w.loadKgM2,
        hasControl: true,
        photoCount: 1,
        checkIns:
          w.kind === 'consumed'
            ? [quiet(7, 50), quiet(14, 5)]
            : [quiet(7, 80, { wormDeaths: true })],
      }));
    fc.assert(
      fc.property(trialsArb, (trials) => {
        const r = aggregateFeedstock(trials);
        for (const g of r.groups) {
          for (const w of g.derivation.whatWouldChange) {
            const after = aggregateFeedstock([...trials, ...hypothetical(w, g.setting, w.trials)]).groups.find((x) => x.key === g.key);
            expect(after?.verdict, w.text).toBe(w.to);
            const fewer = aggregateFeedstock([...trials, ...hypothetical(w, g.setting, w.trials - 1)]).groups.find((x) => x.key === g.key);
            expect(fewer?.verdict, w.text).toBe(g.verdict);
          }
        }
        for (const s of r.settings) {
          for (const w of s.derivation.whatWouldChange) {
            const after = aggregateFeedstock([...trials, ...hypothetical(w, s.setting, w.trials)]).settings.find((x) => x.setting === s.setting);
            expect(after?.verdict, w.text).toBe(w.to);
            const fewer = aggregateFeedstock([...trials, ...hypothetical(w, s.setting, w.trials - 1)]).settings.find((x) => x.setting === s.setting);
            expect(fewer?.verdict, w.text).toBe(s.verdict);
          }
        }
      }),
      { numRuns: 60 },
    );
  });

  it('same input, same output', () => {
    // PRODUCT.md invariants: same input, same output; JSON-serialisable
    fc.assert(
      fc.property(trialsArb, (trials) => {
        const a = aggregateFeedstock(trials);
        const b = aggregateFeedstock(structuredClone(trials));
        expect(b).toStrictEqual(a);
        expect(JSON.parse(JSON.stringify(a))).toStrictEqual(a);
      }),
      { numRuns: NUM_RUNS },
    );
  });
});
