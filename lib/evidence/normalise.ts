/**
 * Trial normalisation: a dose entered in any unit becomes surface load
 * (kg fresh feedstock per m² per application), layer depth (cm) and feed
 * ratio (kg feedstock per kg worms). Also date handling for check-ins.
 */
import { LOAD_DECIMALS } from './thresholds';
import type { DoseEntry, NormalisedDose, TrialInput } from './types';
import { isMassUnit, isVolumeUnit, toCm, toKg, toLitres, toM2 } from './units';

const SCALE = 10 ** LOAD_DECIMALS;

/**
 * Rounds a derived quantity to LOAD_DECIMALS decimals so the same dose in
 * different units gives the identical number. Throws RangeError on non-finite input.
 */
export function roundQuantity(x: number): number {
  if (!Number.isFinite(x)) throw new RangeError(`quantity must be finite, got ${String(x)}`);
  const r = Math.round(x * SCALE) / SCALE;
  return r === 0 ? 0 : r; // no -0 in outputs
}

function positive(x: unknown, what: string): number {
  if (typeof x !== 'number' || !Number.isFinite(x) || x <= 0) {
    throw new RangeError(`${what} must be a finite number > 0, got ${String(x)}`);
  }
  return x;
}

/**
 * Turns a dose entry into surface load, layer depth and feed ratio.
 * A volume dose needs `bulkDensityKgM3`. Layer depth is taken as entered, else
 * estimated as volume / area (a mass dose needs a bulk density for that), else null.
 * Throws RangeError on unknown units, non-finite or non-positive amounts, a
 * volume dose without bulk density, or a load that rounds to zero.
 */
export function normaliseDose(entry: DoseEntry): NormalisedDose {
  const { dose, area } = entry;
  if (!dose || typeof dose !== 'object') throw new RangeError('dose is required');
  if (!area || typeof area !== 'object') throw new RangeError('area is required');
  positive(dose.amount, 'dose amount');
  const areaM2 = positive(toM2(area.amount, area.unit), 'area');
  const density = entry.bulkDensityKgM3 ?? null;
  if (density !== null) positive(density, 'bulk density (kg/m³)');

  let massKg: number;
  let volumeM3: number | null;
  if (isMassUnit(dose.unit)) {
    massKg = toKg(dose.amount, dose.unit);
    volumeM3 = density !== null ? massKg / density : null;
  } else if (isVolumeUnit(dose.unit)) {
    if (density === null) throw new RangeError('a volume dose needs the bulk density (kg/m³)');
    volumeM3 = toLitres(dose.amount, dose.unit) / 1000;
    massKg = volumeM3 * density;
  } else {
    throw new RangeError(`unknown dose unit: ${String((dose as { unit: unknown }).unit)}`);
  }

  const surfaceLoadKgM2 = roundQuantity(massKg / areaM2);
  if (surfaceLoadKgM2 <= 0) throw new RangeError('surface load rounds to zero');

  let layerDepthCm: number | null = null;
  let layerDepthSource: NormalisedDose['layerDepthSource'] = null;
  if (entry.layerDepth) {
    layerDepthCm = roundQuantity(positive(toCm(entry.layerDepth.amount, entry.layerDepth.unit), 'layer depth'));
    layerDepthSource = 'entered';
  } else if (volumeM3 !== null) {
    layerDepthCm = roundQuantity((volumeM3 / areaM2) * 100);
    layerDepthSource = 'estimated';
  }

  let feedRatio: number | null = null;
  if (entry.wormMass) {
    const wormKg = positive(toKg(entry.wormMass.amount, entry.wormMass.unit), 'worm mass');
    feedRatio = roundQuantity(massKg / wormKg);
  }

  return { massKg, areaM2, surfaceLoadKgM2, layerDepthCm, layerDepthSource, feedRatio };
}

/** Loads of a trial on the common scales. */
export interface TrialLoads {
  surfaceLoadKgM2: number;
  layerDepthCm: number | null;
  feedRatio: number | null;
}

/**
 * Surface load, layer depth and feed ratio of a trial: from `dose` when given
 * (it wins), else from `surfaceLoadKgM2` / `layerDepthCm` / `feedRatio`.
 * Throws RangeError when neither gives a surface load > 0, or on bad units.
 */
export function normaliseTrial(trial: Pick<TrialInput, 'id' | 'surfaceLoadKgM2' | 'dose' | 'layerDepthCm' | 'feedRatio'>): TrialLoads {
  if (trial.dose) {
    const d = normaliseDose(trial.dose);
    return {
      surfaceLoadKgM2: d.surfaceLoadKgM2,
      layerDepthCm: d.layerDepthCm ?? (trial.layerDepthCm != null ? roundQuantity(positive(trial.layerDepthCm, 'layer depth')) : null),
      feedRatio: d.feedRatio ?? (trial.feedRatio != null ? roundQuantity(positive(trial.feedRatio, 'feed ratio')) : null),
    };
  }
  if (trial.surfaceLoadKgM2 == null) {
    throw new RangeError(`trial ${trial.id}: give a surface load or a dose with its area`);
  }
  const load = roundQuantity(positive(trial.surfaceLoadKgM2, `trial ${trial.id}: surface load`));
  if (load <= 0) throw new RangeError(`trial ${trial.id}: surface load rounds to zero`);
  return {
    surfaceLoadKgM2: load,
    layerDepthCm: trial.layerDepthCm != null ? roundQuantity(positive(trial.layerDepthCm, 'layer depth')) : null,
    feedRatio: trial.feedRatio != null ? roundQuantity(positive(trial.feedRatio, 'feed ratio')) : null,
  };
}

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

const CUM_DAYS = [0, 31, 59, 90, 120, 151, 181, 212, 243, 273, 304, 334];
/** Days from 0001-01-01 to 1970-01-01. */
const DAYS_TO_1970 = 719162;

function badDate(date: unknown): never {
  throw new RangeError(`date must be a calendar date as YYYY-MM-DD, got ${String(date)}`);
}

/**
 * Day number (days since 1970-01-01, proleptic Gregorian) of a `YYYY-MM-DD`
 * date, years 0001–9999. Throws RangeError on any other format or an impossible date.
 */
export function dayNumber(date: string): number {
  if (typeof date !== 'string' || date.length !== 10 || date.charCodeAt(4) !== 45 || date.charCodeAt(7) !== 45) badDate(date);
  const c0 = date.charCodeAt(0) - 48;
  const c1 = date.charCodeAt(1) - 48;
  const c2 = date.charCodeAt(2) - 48;
  const c3 = date.charCodeAt(3) - 48;
  const c5 = date.charCodeAt(5) - 48;
  const c6 = date.charCodeAt(6) - 48;
  const c8 = date.charCodeAt(8) - 48;
  const c9 = date.charCodeAt(9) - 48;
  if ((c0 | c1 | c2 | c3 | c5 | c6 | c8 | c9) < 0 || c0 > 9 || c1 > 9 || c2 > 9 || c3 > 9 || c5 > 9 || c6 > 9 || c8 > 9 || c9 > 9) {
    badDate(date);
  }
  const y = c0 * 1000 + c1 * 100 + c2 * 10 + c3;
  const m = c5 * 10 + c6;
  const d = c8 * 10 + c9;
  if (y < 1 || m < 1 || m > 12 || d < 1) badDate(date);
  const leap = (y & 3) === 0 && (y % 100 !== 0 || y % 400 === 0);
  if (d > (m === 2 && leap ? 29 : DAYS_IN_MONTH[m - 1])) badDate(date);
  const y1 = y - 1; // whole years before this one (y ≥ 1, so | 0 floors)
  const daysBeforeYear = y1 * 365 + (y1 >> 2) - ((y1 / 100) | 0) + ((y1 / 400) | 0);
  return daysBeforeYear + CUM_DAYS[m - 1] + (leap && m > 2 ? 1 : 0) + d - 1 - DAYS_TO_1970;
}

/** Whole days from `start` to `date` (both `YYYY-MM-DD`). Throws RangeError on bad dates. */
export function daysBetween(start: string, date: string): number {
  return dayNumber(date) - dayNumber(start);
}
