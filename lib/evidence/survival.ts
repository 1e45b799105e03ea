/**
 * Kaplan–Meier (product-limit) estimate of time to consumption.
 *
 * - Censored observations (running, abandoned, or never consumed) stay in the
 *   risk set up to and including their censoring time; at a time with both
 *   events and censorings the events count first (Bland & Altman 1998).
 * - Variance: Greenwood's formula. Pointwise 95 % band on the log(−log S)
 *   scale ("log-log"), S^exp(±z·σ) with σ = sqrt(Σ d/(n(n−d))) / |log S|.
 * - Median: smallest time with S(t) ≤ 0.5 (no midpoint averaging over flat steps).
 * - Median interval: Brookmeyer & Crowley (1982) by inverting the log-log band,
 *   as R's `survfit(conf.type = "log-log")` does: the lower limit is the first
 *   time the lower band is ≤ 0.5, the upper limit the first time the upper band
 *   is ≤ 0.5 (null: not reached). Where S = 0 the log-log band is undefined:
 *   the lower band is 0 and the upper band is null, so an upper limit is never
 *   claimed from an undefined band.
 * O(n log n) for the sort, O(n) after.
 */
import { MEDIAN_SURVIVAL, WILSON_Z } from './thresholds';
import type { SurvivalEstimate, SurvivalRow } from './types';

/** One subject: time and whether the event (consumption) was observed. */
export interface SurvivalObservation {
  time: number;
  event: boolean;
}

const EPS = 1e-12;

/** Method string carried in every estimate. */
export const KM_METHOD = 'Kaplan–Meier; Greenwood variance; log-log band; median interval by Brookmeyer–Crowley inversion';

/**
 * Kaplan–Meier estimate with median and its interval (see the file comment).
 * Throws RangeError on a time that is not finite and ≥ 0, or z not > 0.
 */
export function kaplanMeier(observations: readonly SurvivalObservation[], z: number = WILSON_Z): SurvivalEstimate {
  const n = observations.length;
  let ne = 0;
  for (let i = 0; i < n; i++) if (observations[i].event) ne++;
  const ev = new Float64Array(ne);
  const ce = new Float64Array(n - ne);
  let a = 0;
  let b = 0;
  for (let i = 0; i < n; i++) {
    if (observations[i].event) ev[a++] = observations[i].time;
    else ce[b++] = observations[i].time;
  }
  return kaplanMeierFromTimes(ev, ce, z);
}

/**
 * As `kaplanMeier`, from event times and censoring times (sorted in place).
 * Throws RangeError on a time that is not finite and ≥ 0, or z not > 0.
 */
export function kaplanMeierFromTimes(ev: Float64Array, ce: Float64Array, z: number = WILSON_Z): SurvivalEstimate {
  if (!Number.isFinite(z) || z <= 0) throw new RangeError('z must be > 0');
  for (const arr of [ev, ce]) {
    for (let i = 0; i < arr.length; i++) {
      const t = arr[i];
      if (!(t >= 0) || t === Infinity) throw new RangeError(`time must be finite and ≥ 0, got ${String(t)}`);
    }
  }
  const ne = ev.length;
  const n = ne + ce.length;
  ev.sort();
  ce.sort();

  const table: SurvivalRow[] = [];
  let atRisk = n;
  let s = 1;
  let greenwood = 0;
  let i = 0;
  let j = 0;
  let median: number | null = null;
  let medianLower: number | null = null;
  let medianUpper: number | null = null;
  while (i < ne || j < ce.length) {
    const t = i < ne && (j >= ce.length || ev[i] <= ce[j]) ? ev[i] : ce[j];
    let d = 0;
    while (i < ne && ev[i] === t) {
      d++;
      i++;
    }
    let c = 0;
    while (j < ce.length && ce[j] === t) {
      c++;
      j++;
    }
    // events first, then censorings at the same time
    if (d > 0) {
      s *= 1 - d / atRisk;
      if (atRisk > d) greenwood += d / (atRisk * (atRisk - d));
    }
    let lower: number | null;
    let upper: number | null;
    if (s >= 1 - EPS) {
      lower = 1;
      upper = 1;
    } else if (s <= EPS) {
      s = 0;
      lower = 0;
      upper = null;
    } else {
      const sigma = Math.sqrt(greenwood) / Math.abs(Math.log(s));
      lower = Math.pow(s, Math.exp(z * sigma));
      upper = Math.pow(s, Math.exp(-z * sigma));
    }
    table.push({ time: t, atRisk, events: d, censored: c, survival: s, lower, upper });
    if (median === null && d > 0 && s <= MEDIAN_SURVIVAL + EPS) median = t;
    if (medianLower === null && lower !== null && lower <= MEDIAN_SURVIVAL + EPS) medianLower = t;
    if (medianUpper === null && upper !== null && upper <= MEDIAN_SURVIVAL + EPS) medianUpper = t;
    atRisk -= d + c;
  }
  return {
    n,
    events: ne,
    censored: n - ne,
    median,
    medianLower,
    medianUpper,
    method: KM_METHOD,
    table,
  };
}

/** S(t) of an estimate: the survival after all rows with time ≤ t (1 before the first row). Throws nothing. */
export function survivalAt(estimate: Pick<SurvivalEstimate, 'table'>, t: number): number {
  let s = 1;
  for (const row of estimate.table) {
    if (row.time > t) break;
    s = row.survival;
  }
  return s;
}
