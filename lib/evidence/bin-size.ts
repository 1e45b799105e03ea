/**
 * Bin sizing from weekly food scraps: surface area, a box of whole feet,
 * depth, and the worm mass that eats the scraps at a given feed rate.
 */
import type { MassUnit, Quantity } from './types';
import { AREA_TO_M2, KG_PER_LB, toKg } from './units';

/** Bin surface: 1 ft² per lb of food scraps per week (NC State Extension AG-473-18). */
export const FT2_PER_LB_SCRAPS_PER_WEEK = 1;

/** Suggested bin depth: 8 in, as in the AG-473-18 example boxes (2 × 2 ft and 2 × 3 ft, 8 in deep). */
export const SUGGESTED_DEPTH_IN = 8;

/**
 * Default feed rate, kg food per kg worms per day: about half their body
 * weight a day (Munroe, OACC manual — from memory / V* in TRADE §4; common practice).
 */
export const DEFAULT_FEED_RATE = 0.5;

function nonNegative(x: unknown, what: string): number {
  if (typeof x !== 'number' || !Number.isFinite(x) || x < 0) throw new RangeError(`${what} must be a finite number ≥ 0, got ${String(x)}`);
  return x;
}

function positive(x: unknown, what: string): number {
  if (typeof x !== 'number' || !Number.isFinite(x) || x <= 0) throw new RangeError(`${what} must be a finite number > 0, got ${String(x)}`);
  return x;
}

/** Bin surface area (ft²) for lb of food scraps per week. Throws RangeError on a negative or non-finite amount. */
export function binAreaFt2(lbScrapsPerWeek: number): number {
  return nonNegative(lbScrapsPerWeek, 'scraps per week') * FT2_PER_LB_SCRAPS_PER_WEEK;
}

/** Alias of binAreaFt2, the name used in REFERENCES §3. Throws RangeError like binAreaFt2. */
export const binArea = binAreaFt2;

/** Bin surface area (m²) for kg of food scraps per week (same rule in metric). Throws RangeError like binAreaFt2. */
export function binAreaM2(kgScrapsPerWeek: number): number {
  return binAreaFt2(nonNegative(kgScrapsPerWeek, 'scraps per week') / KG_PER_LB) * AREA_TO_M2.ft2;
}

/** Daily feed (kg/day) for a worm mass (kg) at a feed rate (kg feed per kg worms per day). Throws RangeError on negative input. */
export function dailyFeed(wormMassKg: number, rate: number): number {
  return nonNegative(wormMassKg, 'worm mass') * nonNegative(rate, 'feed rate');
}

/** Worm mass (kg) that eats `feedKgPerDay` at `rate` (default DEFAULT_FEED_RATE). Throws RangeError on negative input or rate ≤ 0. */
export function wormMassForFeed(feedKgPerDay: number, rate: number = DEFAULT_FEED_RATE): number {
  return nonNegative(feedKgPerDay, 'feed per day') / positive(rate, 'feed rate');
}

/** A box of whole feet. */
export interface BoxSize {
  widthFt: number;
  lengthFt: number;
  areaFt2: number;
}

/**
 * Smallest box of whole feet (width ≤ length ≤ 2 × width) with at least the
 * given area; ties go to the squarer box. 3.5 ft² → 2 × 2 ft, 6 ft² → 2 × 3 ft
 * (the AG-473-18 examples). Throws RangeError on a negative or non-finite area.
 */
export function suggestBox(areaFt2: number): BoxSize {
  const need = Math.max(1, nonNegative(areaFt2, 'area'));
  let best: BoxSize | null = null;
  const maxW = Math.ceil(Math.sqrt(need)) + 1;
  for (let w = 1; w <= maxW; w++) {
    for (let l = w; l <= 2 * w; l++) {
      const a = w * l;
      if (a + 1e-9 < need) continue;
      if (best === null || a < best.areaFt2 || (a === best.areaFt2 && l - w < best.lengthFt - best.widthFt)) {
        best = { widthFt: w, lengthFt: l, areaFt2: a };
      }
      break; // longer boxes at this width are only bigger
    }
  }
  return best as BoxSize;
}

/** A bin suggestion for a weekly amount of scraps. */
export interface BinSuggestion {
  scrapsKgPerWeek: number;
  areaFt2: number;
  areaM2: number;
  box: BoxSize;
  depthIn: number;
  depthCm: number;
  feedRate: number;
  wormMassKg: number;
  wormMassLb: number;
}

/**
 * Bin suggestion from weekly scraps: area (1 ft² per lb/week), a whole-foot
 * box, 8 in depth, and worm mass eating the scraps at `feedRate` kg per kg
 * worms per day. Throws RangeError on unknown units, negative amounts or rate ≤ 0.
 */
export function suggestBin(scrapsPerWeek: Quantity<MassUnit>, feedRate: number = DEFAULT_FEED_RATE): BinSuggestion {
  const kg = nonNegative(toKg(scrapsPerWeek.amount, scrapsPerWeek.unit), 'scraps per week');
  const areaFt2 = binAreaFt2(kg / KG_PER_LB);
  const wormMassKg = wormMassForFeed(kg / 7, feedRate);
  return {
    scrapsKgPerWeek: kg,
    areaFt2,
    areaM2: areaFt2 * AREA_TO_M2.ft2,
    box: suggestBox(areaFt2),
    depthIn: SUGGESTED_DEPTH_IN,
    depthCm: SUGGESTED_DEPTH_IN * 2.54,
    feedRate,
    wormMassKg,
    wormMassLb: wormMassKg / KG_PER_LB,
  };
}
