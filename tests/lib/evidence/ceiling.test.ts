import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  CEILING_SUCCESS_THRESHOLD,
  ceilingFromPooled,
  doseCeiling,
  hypotheticalCeiling,
  isotonicNonIncreasing,
  poolByLoad,
  thresholdFraction,
  withExtraTrials,
} from '@/lib/evidence';

const pts = (rows: [number, boolean][]) => rows.map(([loadKgM2, success], i) => ({ id: `t${i}`, loadKgM2, success }));

/** Brute-force non-increasing isotonic fit from the min–max formula: f_i = min_{s≤i} max_{t≥i} mean(s..t). */
function bruteFit(ys: number[], ws: number[]): number[] {
  const m = ys.length;
  const mean = (s: number, t: number) => {
    let a = 0;
    let w = 0;
    for (let k = s; k <= t; k++) {
      a += ys[k] * ws[k];
      w += ws[k];
    }
    return a / w;
  };
  return ys.map((_, i) => {
    let best = Infinity;
    for (let s = 0; s <= i; s++) {
      let mx = -Infinity;
      for (let t = i; t < m; t++) mx = Math.max(mx, mean(s, t));
      best = Math.min(best, mx);
    }
    return best;
  });
}

describe('pool-adjacent-violators fit', () => {
  it('matches the min–max formula on random data', () => {
    // textbook identity for isotonic regression (Barlow et al. 1972, from memory): PAVA = min–max of block means
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: 1, max: 12 }), fc.boolean()), { minLength: 1, maxLength: 25 }), (rows) => {
        const pooled = poolByLoad(pts(rows));
        const ys = pooled.successes.map((s, i) => s / pooled.weights[i]);
        const brute = bruteFit(ys, pooled.weights);
        const generic = isotonicNonIncreasing(pooled.loads.map((x, i) => ({ x, y: ys[i], w: pooled.weights[i] })));
        const c = ceilingFromPooled(pooled);
        let b = 0;
        pooled.loads.forEach((x, i) => {
          while (x > pooled.loads[c.blocks[b].end]) b++;
          const fit = c.blocks[b].sum / c.blocks[b].weight;
          expect(fit).toBeCloseTo(brute[i], 12);
          expect(generic[i]).toBeCloseTo(brute[i], 12);
        });
      }),
      { numRuns: 300 },
    );
  });

  it('fit is non-increasing and pools trials at equal loads', () => {
    // PRODUCT.md step 3: monotone (non-increasing) fit of success against surface load, weighted
    const e = doseCeiling(pts([[1, true], [1, false], [2, true], [3, false], [3, false]]));
    const fits = e.blocks.map((b) => b.fitted);
    for (let i = 1; i < fits.length; i++) expect(fits[i]).toBeLessThanOrEqual(fits[i - 1]);
    expect(e.blocks.reduce((s, b) => s + b.weight, 0)).toBe(5);
    expect(isotonicNonIncreasing([{ x: 1, y: 0 }, { x: 2, y: 1 }])).toEqual([0.5, 0.5]);
  });
});

describe('dose ceiling', () => {
  it('uses threshold 0.8, inclusive', () => {
    // project rule (thresholds.ts): CEILING_SUCCESS_THRESHOLD = 0.8; "at or above" → 4 of 5 qualifies exactly
    expect(CEILING_SUCCESS_THRESHOLD).toBe(0.8);
    expect(thresholdFraction(0.8)).toEqual({ num: 4, den: 5 });
    const four5 = doseCeiling(pts([[2, true], [2, true], [2, true], [2, true], [2, false]]));
    expect(four5.kgM2).toBe(2);
    const three4 = doseCeiling(pts([[2, true], [2, true], [2, true], [2, false]]));
    expect(three4.kgM2).toBeNull();
  });

  it('highest tested load whose fit stays at or above the threshold', () => {
    // PRODUCT.md step 3 + project rule CEILING_SUCCESS_THRESHOLD = 0.8
    const e = doseCeiling(pts([[1, true], [2, true], [4, true], [6, true], [9, false], [12, false]]));
    expect(e.kgM2).toBe(6);
    expect(e.isHighestTested).toBe(false);
    expect(e.nextLoadAboveKgM2).toBe(9);
    expect(e.lowestTestedKgM2).toBe(1);
    expect(e.highestTestedKgM2).toBe(12);
    expect(e.trialIdsAtCeiling).toEqual(['t3']);
  });

  it('a violation pools blocks: one failure at a low load can pull the fit under', () => {
    // 1: fail, 2..4: success → pooled mean 3/4 < 0.8 → no ceiling
    expect(doseCeiling(pts([[1, false], [2, true], [3, true], [4, true]])).kgM2).toBeNull();
    // with four successes above, 4/5 = 0.8 qualifies up to the top
    const e = doseCeiling(pts([[1, false], [2, true], [3, true], [4, true], [5, true]]));
    expect(e.kgM2).toBe(5);
    expect(e.isHighestTested).toBe(true);
    expect(e.nextLoadAboveKgM2).toBeNull();
  });

  it('null without trials or when nothing qualifies', () => {
    // project rule (brief): the ceiling is null when not determinable
    const none = doseCeiling([]);
    expect(none.kgM2).toBeNull();
    expect(none.lowestTestedKgM2).toBeNull();
    expect(none.blocks).toEqual([]);
    const bad = doseCeiling(pts([[1, false], [3, false]]));
    expect(bad.kgM2).toBeNull();
    expect(bad.nextLoadAboveKgM2).toBe(1);
  });

  it('an added success never lowers the ceiling; an added failure never raises it', () => {
    // PRODUCT.md invariants: adding a successful trial never lowers a ceiling
    const rank = (x: number | null) => (x === null ? -Infinity : x);
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 1, max: 10 }), fc.boolean()), { maxLength: 20 }),
        fc.integer({ min: 1, max: 12 }),
        (rows, load) => {
          const base = doseCeiling(pts(rows)).kgM2;
          const withSuccess = doseCeiling(pts([...rows, [load, true]])).kgM2;
          const withFailure = doseCeiling(pts([...rows, [load, false]])).kgM2;
          expect(rank(withSuccess)).toBeGreaterThanOrEqual(rank(base));
          expect(rank(withFailure)).toBeLessThanOrEqual(rank(base));
        },
      ),
      { numRuns: 400 },
    );
  });

  it('hypotheticalCeiling equals refitting with the extra trials', () => {
    // project rule (ceiling.ts): the fast what-would-change path must agree with a full refit
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 1, max: 10 }), fc.boolean()), { maxLength: 20 }),
        fc.integer({ min: 1, max: 12 }),
        fc.integer({ min: 1, max: 5 }),
        fc.boolean(),
        (rows, load, k, success) => {
          const pooled = poolByLoad(pts(rows));
          const fast = hypotheticalCeiling(pooled, load, success ? k : 0, k);
          const slow = ceilingFromPooled(withExtraTrials(pooled, load, success ? k : 0, k)).kgM2;
          expect(fast).toBe(slow);
          expect(hypotheticalCeiling(pooled, load, 0, 0)).toBe(ceilingFromPooled(pooled).kgM2);
        },
      ),
      { numRuns: 400 },
    );
  });

  it('does not depend on input order', () => {
    // PRODUCT.md invariants: the result does not depend on trial order
    const rows: [number, boolean][] = [[3, true], [1, false], [2, true], [3, false], [1, true]];
    const a = doseCeiling(pts(rows));
    const b = doseCeiling(pts(rows).reverse());
    expect(b).toStrictEqual(a);
  });

  it('throws RangeError on bad loads and thresholds', () => {
    // project rule: invalid input is a RangeError
    expect(() => doseCeiling(pts([[0, true]]))).toThrow(RangeError);
    expect(() => doseCeiling(pts([[Number.NaN, true]]))).toThrow(RangeError);
    expect(() => thresholdFraction(1.5)).toThrow(RangeError);
    expect(() => thresholdFraction(Math.PI / 4)).toThrow(RangeError);
    expect(() => withExtraTrials(poolByLoad([]), 1, 2, 1)).toThrow(RangeError);
  });
});
