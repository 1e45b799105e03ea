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

function digit(s: string, i: number): number {
  const c = s.charCodeAt(i) - 48;
  if (c < 0 || c > 9) return -1;
  return c;
}

/**
 * Day number (days since 1970-01-01, proleptic Gregorian) of a `YYYY-MM-DD`
 * date. Throws RangeError on any other format or an impossible date.
 */
export function dayNumber(date: string): number {
  if (typeof date !== 'string' || date.length !== 10 || date.charCodeAt(4) !== 45 || date.charCodeAt(7) !== 45) {
    throw new RangeError(`date must be YYYY-MM-DD, got ${String(date)}`);
  }
  const ds = [0, 1, 2, 3, 5, 6, 8, 9].map((i) => digit(date, i));
  if (ds.some((d) => d < 0)) throw new RangeError(`date must be YYYY-MM-DD, got ${date}`);
  const y = ds[0] * 1000 + ds[1] * 100 + ds[2] * 10 + ds[3];
  const m = ds[4] * 10 + ds[5];
  const d = ds[6] * 10 + ds[7];
  const leap = (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
  const dim = m === 2 && leap ? 29 : DAYS_IN_MONTH[m - 1];
  if (m < 1 || m > 12 || d < 1 || d > dim) throw new RangeError(`not a calendar date: ${date}`);
  // days-from-civil (H. Hinnant's algorithm)
  const yy = m <= 2 ? y - 1 : y;
  const era = Math.floor(yy / 400);
  const yoe = yy - era * 400;
  const mp = (m + 9) % 12;
  const doy = Math.floor((153 * mp + 2) / 5) + d - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146097 + doe - 719468;
}

/** Whole days from `start` to `date` (both `YYYY-MM-DD`). Throws RangeError on bad dates. */
export function daysBetween(start: string, date: string): number {
  return dayNumber(date) - dayNumber(start);
}
