/**
 * Dose ceiling: a weighted pool-adjacent-violators (PAVA) fit of the consumed
 * share against surface load, constrained to be non-increasing (more load is
 * never easier), and the highest tested load whose fitted share stays at or
 * above CEILING_SUCCESS_THRESHOLD.
 *
 * Trials at the same load are pooled first (weight = number of trials), so
 * the fit is O(m) in the number of distinct loads after an O(n log n) sort.
 * Sums and weights are integer counts, so comparisons are exact and the
 * result does not depend on input order.
 */
import { CEILING_SUCCESS_THRESHOLD } from './thresholds';
import type { CeilingEstimate, FitBlock } from './types';

/** Finished trials pooled by distinct load, ascending. */
export interface PooledLoads {
  loads: number[];
  /** Consumed trials at each load. */
  successes: number[];
  /** All finished trials at each load. */
  weights: number[];
}

/** One PAVA block over pooled indices [start, end]. */
export interface PavaBlock {
  start: number;
  end: number;
  sum: number;
  weight: number;
}

/** A finished trial as the ceiling sees it. */
export interface CeilingPoint {
  id: string;
  loadKgM2: number;
  success: boolean;
}

/** A threshold as an exact fraction num/den (den ≤ 1000), so comparisons with integer counts are exact. */
export interface ThresholdFraction {
  num: number;
  den: number;
}

/**
 * The threshold as a fraction with the smallest denominator ≤ 1000 that
 * represents it to 1e-12 (0.8 → 4/5). Throws RangeError outside [0, 1] or
 * when no such fraction exists.
 */
export function thresholdFraction(threshold: number): ThresholdFraction {
  if (!Number.isFinite(threshold) || threshold < 0 || threshold > 1) throw new RangeError('threshold must be in [0, 1]');
  for (let den = 1; den <= 1000; den++) {
    const num = Math.round(threshold * den);
    if (Math.abs(num / den - threshold) < 1e-12) return { num, den };
  }
  throw new RangeError('threshold must be a fraction with a denominator of at most 1000');
}

/** True when sum / weight ≥ num / den, exactly for integer counts. */
function meets(sum: number, weight: number, f: ThresholdFraction): boolean {
  return sum * f.den >= f.num * weight;
}

/**
 * Pools points by identical load, ascending. Throws RangeError on a load that is not finite and > 0.
 */
export function poolByLoad(points: readonly { loadKgM2: number; success: boolean }[]): PooledLoads {
  const n = points.length;
  let ns = 0;
  for (let i = 0; i < n; i++) if (points[i].success) ns++;
  const all = new Float64Array(n);
  const succ = new Float64Array(ns);
  let k = 0;
  for (let i = 0; i < n; i++) {
    all[i] = points[i].loadKgM2;
    if (points[i].success) succ[k++] = points[i].loadKgM2;
  }
  return poolLoads(all, succ);
}

/**
 * Pools loads given as two arrays: every finished trial's load, and the loads
 * of the consumed ones (a sub-multiset). Sorts both in place (native numeric
 * sort) and merges. Throws RangeError on a load that is not finite and > 0.
 */
export function poolLoads(allLoads: Float64Array, successLoads: Float64Array): PooledLoads {
  for (let i = 0; i < allLoads.length; i++) {
    const x = allLoads[i];
    if (!(x > 0) || x === Infinity) throw new RangeError(`load must be finite and > 0, got ${String(x)}`);
  }
  allLoads.sort();
  successLoads.sort();
  const loads: number[] = [];
  const successes: number[] = [];
  const weights: number[] = [];
  let j = 0;
  for (let i = 0; i < allLoads.length; ) {
    const x = allLoads[i];
    let w = 0;
    while (i < allLoads.length && allLoads[i] === x) {
      w++;
      i++;
    }
    let s = 0;
    while (j < successLoads.length && successLoads[j] === x) {
      s++;
      j++;
    }
    loads.push(x);
    weights.push(w);
    successes.push(s);
  }
  return { loads, successes, weights };
}

/**
 * Weighted pool-adjacent-violators for a non-increasing fit over pooled loads.
 * Each block's fitted value is sum / weight. O(m). Throws nothing for valid pooled input.
 */
export function pavaNonIncreasing(pooled: PooledLoads): PavaBlock[] {
  const m = pooled.loads.length;
  const stack: PavaBlock[] = [];
  for (let i = 0; i < m; i++) {
    let cur: PavaBlock = { start: i, end: i, sum: pooled.successes[i], weight: pooled.weights[i] };
    // Violation of "non-increasing": previous mean < current mean (exact with integer counts).
    while (stack.length > 0) {
      const prev = stack[stack.length - 1];
      if (prev.sum * cur.weight < cur.sum * prev.weight) {
        stack.pop();
        cur = { start: prev.start, end: cur.end, sum: prev.sum + cur.sum, weight: prev.weight + cur.weight };
      } else break;
    }
    stack.push(cur);
  }
  return stack;
}

/** Generic weighted isotonic (non-increasing) regression; returns the fitted value per input point, in input order. Throws RangeError on non-finite input or weights ≤ 0. */
export function isotonicNonIncreasing(points: readonly { x: number; y: number; w?: number }[]): number[] {
  const n = points.length;
  const order = Array.from({ length: n }, (_, i) => i);
  for (const p of points) {
    if (!Number.isFinite(p.x) || !Number.isFinite(p.y)) throw new RangeError('points must be finite');
    if (p.w !== undefined && (!Number.isFinite(p.w) || p.w <= 0)) throw new RangeError('weights must be > 0');
  }
  order.sort((a, b) => points[a].x - points[b].x);
  type B = { xs: number[]; sum: number; w: number };
  const stack: B[] = [];
  let k = 0;
  while (k < n) {
    const x = points[order[k]].x;
    const idx: number[] = [];
    let sum = 0;
    let w = 0;
    while (k < n && points[order[k]].x === x) {
      const p = points[order[k]];
      const pw = p.w ?? 1;
      sum += p.y * pw;
      w += pw;
      idx.push(order[k]);
      k++;
    }
    let cur: B = { xs: idx, sum, w };
    while (stack.length > 0) {
      const prev = stack[stack.length - 1];
      if (prev.sum / prev.w < cur.sum / cur.w) {
        stack.pop();
        cur = { xs: prev.xs.concat(cur.xs), sum: prev.sum + cur.sum, w: prev.w + cur.w };
      } else break;
    }
    stack.push(cur);
  }
  const fitted = new Array<number>(n);
  for (const b of stack) for (const i of b.xs) fitted[i] = b.sum / b.w;
  return fitted;
}

/** The ceiling read off a fit, without trial ids. */
export interface CeilingCore {
  kgM2: number | null;
  isHighestTested: boolean;
  nextLoadAboveKgM2: number | null;
  blocks: PavaBlock[];
}

/**
 * Ceiling from pooled loads: the highest load whose block mean is ≥ threshold
 * (blocks are non-increasing, so qualifying blocks form a prefix). `null` when
 * no load qualifies or there are no loads.
 * Throws RangeError on a threshold outside [0, 1].
 */
export function ceilingFromPooled(pooled: PooledLoads, threshold: number = CEILING_SUCCESS_THRESHOLD): CeilingCore {
  const blocks = pavaNonIncreasing(pooled);
  const f = thresholdFraction(threshold);
  let lastOk = -1;
  for (let b = 0; b < blocks.length; b++) {
    if (meets(blocks[b].sum, blocks[b].weight, f)) lastOk = b;
    else break;
  }
  const m = pooled.loads.length;
  if (lastOk < 0) {
    return { kgM2: null, isHighestTested: false, nextLoadAboveKgM2: m > 0 ? pooled.loads[0] : null, blocks };
  }
  const endIdx = blocks[lastOk].end;
  return {
    kgM2: pooled.loads[endIdx],
    isHighestTested: endIdx === m - 1,
    nextLoadAboveKgM2: endIdx + 1 < m ? pooled.loads[endIdx + 1] : null,
    blocks,
  };
}

/** Reused buffers of hypotheticalCeiling (a cache only: results never depend on it). */
let scratch = { xs: new Float64Array(64), a: new Float64Array(64), sufMax: new Float64Array(64) };

/**
 * Ceiling (kg/m², or null) after adding `weight` hypothetical trials, `successes`
 * of them consumed, at `load` — without building a new fit. Uses the min–max
 * form of isotonic regression: for a non-increasing fit, the fitted value at
 * point i is min over s ≤ i of max over t ≥ i of the mean of points s..t, so
 * fit(i) ≥ c exactly when max_{t ≥ i} P[t+1] ≥ max_{s ≤ i} P[s], with P the
 * prefix sums of (successes·den − num·weight). Integer arithmetic, one O(m)
 * pass each way over reused scratch buffers. Gives the same
 * answer as withExtraTrials + ceilingFromPooled (tested).
 * Throws RangeError on a bad load or counts.
 */
export function hypotheticalCeiling(
  pooled: PooledLoads,
  load: number,
  successes: number,
  weight: number,
  threshold: number = CEILING_SUCCESS_THRESHOLD,
): number | null {
  if (!Number.isFinite(load) || load <= 0) throw new RangeError('load must be finite and > 0');
  if (!Number.isInteger(weight) || weight < 0 || !Number.isInteger(successes) || successes < 0 || successes > weight) {
    throw new RangeError('bad hypothetical counts');
  }
  const f = thresholdFraction(threshold);
  const { loads, successes: succ, weights } = pooled;
  const m = loads.length;
  // position of the hypothetical point: merge into an equal load or insert before the first larger one
  let q = 0;
  while (q < m && loads[q] < load) q++;
  const merge = q < m && loads[q] === load;
  const size = weight === 0 ? m : merge ? m : m + 1;
  if (scratch.xs.length < size) {
    const cap = Math.max(size, 2 * scratch.xs.length);
    scratch = { xs: new Float64Array(cap), a: new Float64Array(cap), sufMax: new Float64Array(cap) };
  }
  const { xs, a, sufMax } = scratch;
  let k = 0;
  for (let j = 0; j < m; j++) {
    if (weight > 0 && !merge && j === q) {
      xs[k] = load;
      a[k++] = successes * f.den - f.num * weight;
    }
    xs[k] = loads[j];
    a[k++] = succ[j] * f.den - f.num * weights[j] + (weight > 0 && merge && j === q ? successes * f.den - f.num * weight : 0);
  }
  if (weight > 0 && !merge && q === m) {
    xs[k] = load;
    a[k++] = successes * f.den - f.num * weight;
  }
  if (size === 0) return null;
  // suffix max of P[t+1] for t ≥ i, computed backwards: P[t+1] = total − Σ_{j>t} a_j
  let total = 0;
  for (let j = 0; j < size; j++) total += a[j];
  let p = total;
  let best = -Infinity;
  for (let i = size - 1; i >= 0; i--) {
    if (p > best) best = p; // p = P[i+1]
    sufMax[i] = best;
    p -= a[i];
  }
  let prefMax = -Infinity;
  let prefix = 0;
  let ceiling: number | null = null;
  for (let i = 0; i < size; i++) {
    if (prefix > prefMax) prefMax = prefix; // prefix = P[i]
    if (sufMax[i] >= prefMax) ceiling = xs[i];
    else break; // qualifying points form a prefix
    prefix += a[i];
  }
  return ceiling;
}

/**
 * Pooled loads with `weight` extra trials (`successes` of them consumed) at
 * `load`, without changing the input. O(m). Throws RangeError on a bad load or counts.
 */
export function withExtraTrials(pooled: PooledLoads, load: number, successes: number, weight: number): PooledLoads {
  if (!Number.isFinite(load) || load <= 0) throw new RangeError('load must be finite and > 0');
  if (!Number.isInteger(weight) || weight < 1 || !Number.isInteger(successes) || successes < 0 || successes > weight) {
    throw new RangeError('bad hypothetical counts');
  }
  const loads = pooled.loads.slice();
  const succ = pooled.successes.slice();
  const w = pooled.weights.slice();
  // binary search for insertion point
  let lo = 0;
  let hi = loads.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (loads[mid] < load) lo = mid + 1;
    else hi = mid;
  }
  if (lo < loads.length && loads[lo] === load) {
    succ[lo] += successes;
    w[lo] += weight;
  } else {
    loads.splice(lo, 0, load);
    succ.splice(lo, 0, successes);
    w.splice(lo, 0, weight);
  }
  return { loads, successes: succ, weights: w };
}

/** Fit blocks in loads and fitted values, for output. Throws nothing. */
export function fitBlocks(pooled: PooledLoads, blocks: readonly PavaBlock[]): FitBlock[] {
  return blocks.map((b) => ({
    fromKgM2: pooled.loads[b.start],
    toKgM2: pooled.loads[b.end],
    fitted: b.sum / b.weight,
    weight: b.weight,
  }));
}

/**
 * Dose ceiling of a set of finished trials (consumed = success). Returns the
 * ceiling, whether it is simply the highest tested load, the next tested load
 * above it, the fit blocks and the trials at the ceiling load (sorted ids).
 * Throws RangeError on loads that are not finite and > 0.
 */
export function doseCeiling(points: readonly CeilingPoint[], threshold: number = CEILING_SUCCESS_THRESHOLD): CeilingEstimate {
  const pooled = poolByLoad(points);
  return ceilingEstimateFromPooled(pooled, (x) => points.filter((p) => p.loadKgM2 === x).map((p) => p.id), threshold);
}

/** As `doseCeiling`, with the pooled loads already computed; `idsAtLoad` lists the trials at a load. Throws RangeError like ceilingFromPooled. */
export function ceilingEstimateFromPooled(
  pooled: PooledLoads,
  idsAtLoad: (loadKgM2: number) => string[],
  threshold: number = CEILING_SUCCESS_THRESHOLD,
): CeilingEstimate {
  const core = ceilingFromPooled(pooled, threshold);
  const m = pooled.loads.length;
  const atCeiling = core.kgM2 === null ? [] : idsAtLoad(core.kgM2).slice().sort(byString);
  return {
    kgM2: core.kgM2,
    threshold,
    isHighestTested: core.isHighestTested,
    lowestTestedKgM2: m > 0 ? pooled.loads[0] : null,
    highestTestedKgM2: m > 0 ? pooled.loads[m - 1] : null,
    nextLoadAboveKgM2: core.nextLoadAboveKgM2,
    blocks: fitBlocks(pooled, core.blocks),
    trialIdsAtCeiling: atCeiling,
  };
}

/** Code-unit string order (locale-independent, deterministic). Throws nothing. */
export function byString(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}
