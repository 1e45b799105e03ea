import fc from 'fast-check';
import { jStat } from 'jstat';
import { describe, expect, it } from 'vitest';
import { proportionEstimate, wilson, WILSON_Z } from '@/lib/evidence';

describe('Wilson score interval', () => {
  it('pins z = 1.96 exactly', () => {
    // REFERENCES §6a (D): the npm README values reproduce only with z = 1.96, so the engine pins 1.96 (not 1.959964)
    expect(WILSON_Z).toBe(1.96);
  });

  it.each([
    // REFERENCES §6a: Newcombe 1998, Stat Med 17:857–872, Table I (V2: values as asserted in a public test file; table number M)
    [81, 263, 0.2553, 0.3662],
    [15, 148, 0.0624, 0.1605],
    [0, 20, 0.0, 0.1611],
    [1, 29, 0.0061, 0.1718],
  ])('Newcombe 1998: %i/%i → %f–%f', (r, n, lo, hi) => {
    // REFERENCES §6a: Newcombe 1998 Table I (V2), tolerance ±0.00005
    const w = wilson(r, n);
    expect(Math.abs(w.lower - lo)).toBeLessThanOrEqual(0.00005);
    expect(Math.abs(w.upper - hi)).toBeLessThanOrEqual(0.00005);
    // REFERENCES §6a (D): the same four rows reproduce with z = 1.959964
    const w2 = wilson(r, n, 1.959964);
    expect(Math.abs(w2.lower - lo)).toBeLessThanOrEqual(0.00005);
    expect(Math.abs(w2.upper - hi)).toBeLessThanOrEqual(0.00005);
  });

  it.each([
    // REFERENCES §6a: README of npm package wilson-score-interval (msn0/wilson-score-interval), V; reproduce with z = 1.96
    [430, 474, 0.8776750858242243, 0.9301239839930541],
    [10, 14, 0.4535045882751561, 0.882788120898909],
    [392, 436, 0.8672311846637769, 0.9239627360567735],
  ])('npm wilson-score-interval README: %i/%i', (r, n, lo, hi) => {
    // REFERENCES §6a: npm wilson-score-interval README (V), tolerance 1e-12 with z = 1.96
    const w = wilson(r, n);
    expect(Math.abs(w.lower - lo)).toBeLessThanOrEqual(1e-12);
    expect(Math.abs(w.upper - hi)).toBeLessThanOrEqual(1e-12);
  });

  it('the README values do not reproduce to 1e-12 with z = 1.959964', () => {
    // REFERENCES §6a (D): "reproduce to 1e-15 only with z = 1.96 exactly"
    const w = wilson(430, 474, 1.959964);
    expect(Math.abs(w.lower - 0.8776750858242243)).toBeGreaterThan(1e-12);
  });

  it('edge cases and monotonicity used by the verdict rules', () => {
    // project rule (verdict.ts): L(r+1, n+1) ≥ L(r, n) and L(r, n+1) ≤ L(r, n) make the feed rule monotone
    expect(wilson(0, 5).lower).toBe(0);
    expect(wilson(5, 5).upper).toBe(1);
    let violations = 0;
    for (let n = 1; n <= 300; n++) {
      for (let r = 0; r <= n; r++) {
        const a = wilson(r, n).lower;
        if (wilson(r + 1, n + 1).lower < a) violations++;
        if (wilson(r, n + 1).lower > a) violations++;
      }
    }
    expect(violations).toBe(0);
    expect(proportionEstimate(0, 0)).toStrictEqual({ successes: 0, n: 0, proportion: null, lower: null, upper: null, z: 1.96 });
    expect(() => wilson(3, 2)).toThrow(RangeError);
    expect(() => wilson(1, 0)).toThrow(RangeError);
    expect(() => wilson(0.5, 2)).toThrow(RangeError);
    expect(() => wilson(1, 2, 0)).toThrow(RangeError);
  });

  it('cross-check against jstat on random inputs: bounds are where the score test is exactly significant', () => {
    // Independent formulation with npm jstat: z from jStat.normal.inv(0.975), and each bound p solves
    // 2·(1 − Φ(|p̂ − p| / sqrt(p(1−p)/n))) = 0.05 with Φ = jStat.normal.cdf, found by bisection.
    const zJ = jStat.normal.inv(0.975, 0, 1);
    expect(zJ).toBeCloseTo(1.959964, 6);
    const pValue = (phat: number, p: number, n: number) => 2 * (1 - jStat.normal.cdf(Math.abs(phat - p) / Math.sqrt((p * (1 - p)) / n), 0, 1));
    const bisect = (lo: number, hi: number, f: (x: number) => number) => {
      let flo = f(lo);
      for (let i = 0; i < 200; i++) {
        const mid = (lo + hi) / 2;
        const fm = f(mid);
        if (Math.sign(fm) === Math.sign(flo)) {
          lo = mid;
          flo = fm;
        } else hi = mid;
      }
      return (lo + hi) / 2;
    };
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 2000 }), fc.double({ min: 0, max: 1, noNaN: true }), (n, u) => {
        const r = Math.min(n, Math.floor(u * (n + 1)));
        const phat = r / n;
        const w = wilson(r, n, zJ);
        const g = (p: number) => pValue(phat, p, n) - 0.05;
        // start just inside (0, 1): at p = p̂ ∈ {0, 1} the statistic is 0/0
        const lower = r === 0 ? 0 : bisect(1e-12, Math.min(phat, 1 - 1e-12), g);
        const upper = r === n ? 1 : bisect(Math.max(phat, 1e-12), 1 - 1e-12, g);
        expect(Math.abs(w.lower - lower)).toBeLessThan(1e-7);
        expect(Math.abs(w.upper - upper)).toBeLessThan(1e-7);
      }),
      { numRuns: 200 },
    );
  });
});
