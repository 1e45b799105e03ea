/**
 * Wilson score interval for a binomial proportion (Wilson 1927; Newcombe 1998
 * method 3, no continuity correction).
 */
import { WILSON_Z } from './thresholds';
import type { ProportionEstimate } from './types';

/** Lower and upper Wilson bounds. */
export interface WilsonInterval {
  lower: number;
  upper: number;
}

/**
 * Wilson score interval of `successes` out of `n` with normal quantile `z`
 * (default WILSON_Z = 1.96 exactly, see thresholds.ts). Bounds are clamped to [0, 1].
 * Throws RangeError unless 0 ≤ successes ≤ n, n ≥ 1, both integers, and z > 0 finite.
 */
export function wilson(successes: number, n: number, z: number = WILSON_Z): WilsonInterval {
  if (!Number.isInteger(n) || n < 1) throw new RangeError(`n must be a positive integer, got ${String(n)}`);
  if (!Number.isInteger(successes) || successes < 0 || successes > n) {
    throw new RangeError(`successes must be an integer in 0..n, got ${String(successes)}`);
  }
  if (!Number.isFinite(z) || z <= 0) throw new RangeError(`z must be > 0, got ${String(z)}`);
  const p = successes / n;
  const z2 = z * z;
  const denom = 1 + z2 / n;
  const centre = p + z2 / (2 * n);
  const half = z * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n));
  const lower = successes === 0 ? 0 : Math.max(0, (centre - half) / denom);
  const upper = successes === n ? 1 : Math.min(1, (centre + half) / denom);
  return { lower, upper };
}

/**
 * Proportion with its Wilson interval; with n = 0 every number is `null`.
 * Throws RangeError like `wilson` for impossible counts.
 */
export function proportionEstimate(successes: number, n: number, z: number = WILSON_Z): ProportionEstimate {
  if (n === 0) {
    if (successes !== 0) throw new RangeError('successes must be 0 when n is 0');
    return { successes, n, proportion: null, lower: null, upper: null, z };
  }
  const { lower, upper } = wilson(successes, n, z);
  return { successes, n, proportion: successes / n, lower, upper, z };
}
