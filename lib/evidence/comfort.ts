/**
 * Worm comfort check: is a bed temperature and moisture within limits,
 * stressful, or lethal for a composting-worm species?
 */
import type { MoistureLevel } from './types';

/** Composting-worm species the check knows. */
export type WormSpecies = 'eisenia-fetida' | 'eisenia-andrei' | 'perionyx-excavatus' | 'eudrilus-eugeniae';

/** Result of a comfort check. */
export type ComfortStatus = 'within limits' | 'stressful' | 'lethal';

/** One reading's status and the specific reason. */
export interface ComfortReading {
  status: ComfortStatus;
  reason: string;
}

/** Limits for one species; a `null` limit is not known. */
export interface SpeciesLimits {
  /** At or below this °C the bed kills worms. */
  lethalColdAtOrBelowC: number | null;
  /** Below this °C (and above lethal cold) is lethal for species with no stressful cold band. */
  lethalColdBelowC: number | null;
  /** Lower limit of the comfortable range (°C); below it is stressful. */
  minC: number;
  /** Upper limit of the comfortable range (°C); above it is stressful. */
  maxC: number;
  /** At or above this °C worms die. */
  lethalHeatAtOrAboveC: number | null;
  /** Above this °C worms die (for species whose limit is "above about"). */
  lethalHeatAboveC: number | null;
  /** Moisture limits, % of wet mass. */
  moistureMinPct: number;
  moistureMaxPct: number;
  sources: string[];
}

const FETIDA: SpeciesLimits = {
  // common practice (no published source): a frozen bed kills composting worms
  lethalColdAtOrBelowC: 0,
  lethalColdBelowC: null,
  // breeding limits 4–30 °C, moisture limits 60–90 %: Edwards (ed.) 2004, ch. 18, Table 18.3 (REFERENCES §3, V2)
  minC: 4,
  maxC: 30,
  // worms die at 35 °C: Loehr, Neuhauser & Malecki 1985 (REFERENCES §3, V abstract)
  lethalHeatAtOrAboveC: 35,
  lethalHeatAboveC: null,
  moistureMinPct: 60,
  moistureMaxPct: 90,
  sources: ['Edwards (ed.) 2004, ch. 18, Table 18.3', 'Loehr, Neuhauser & Malecki 1985', 'common practice: freezing'],
};

/** Limits per species. */
export const SPECIES_LIMITS: Readonly<Record<WormSpecies, SpeciesLimits>> = {
  'eisenia-fetida': FETIDA,
  // from memory: E. andrei is treated like its sibling species E. fetida (Table 18.3 is for E. fetida)
  'eisenia-andrei': { ...FETIDA, sources: [...FETIDA.sources, 'from memory: same limits as E. fetida'] },
  // TRADE §4 (RVS92; the 9 / 30 °C figures are from memory): cold-limited, die below about 9 °C and above about 30 °C.
  // Moisture limits applied from E. fetida (from memory; no species-specific value in our sources).
  'perionyx-excavatus': {
    lethalColdAtOrBelowC: null,
    lethalColdBelowC: 9,
    minC: 9,
    maxC: 30,
    lethalHeatAtOrAboveC: null,
    lethalHeatAboveC: 30,
    moistureMinPct: 60,
    moistureMaxPct: 90,
    sources: ['Reinecke, Viljoen & Saayman (abstract); 9 and 30 °C from memory', 'moisture: from memory, as E. fetida'],
  },
  'eudrilus-eugeniae': {
    lethalColdAtOrBelowC: null,
    lethalColdBelowC: 9,
    minC: 9,
    maxC: 30,
    lethalHeatAtOrAboveC: null,
    lethalHeatAboveC: 30,
    moistureMinPct: 60,
    moistureMaxPct: 90,
    sources: ['Reinecke, Viljoen & Saayman (abstract); 9 and 30 °C from memory', 'moisture: from memory, as E. fetida'],
  },
};

function limitsOf(species: WormSpecies): SpeciesLimits {
  const l = SPECIES_LIMITS[species];
  if (!l) throw new RangeError(`unknown worm species ${String(species)}`);
  return l;
}

/**
 * Temperature status of a bed for a species (default E. fetida), with the
 * limit that decided it, e.g. "below the 4 °C limit".
 * Throws RangeError on a non-finite temperature or unknown species.
 */
export function tempStatus(bedTempC: number, species: WormSpecies = 'eisenia-fetida'): ComfortReading {
  if (typeof bedTempC !== 'number' || !Number.isFinite(bedTempC)) throw new RangeError('temperature must be a finite number');
  const l = limitsOf(species);
  const t = bedTempC;
  if (l.lethalHeatAtOrAboveC !== null && t >= l.lethalHeatAtOrAboveC) {
    return { status: 'lethal', reason: `at or above ${l.lethalHeatAtOrAboveC} °C, where worms die` };
  }
  if (l.lethalHeatAboveC !== null && t > l.lethalHeatAboveC) {
    return { status: 'lethal', reason: `above the ${l.lethalHeatAboveC} °C limit, where worms die` };
  }
  if (l.lethalColdAtOrBelowC !== null && t <= l.lethalColdAtOrBelowC) {
    return { status: 'lethal', reason: `at or below ${l.lethalColdAtOrBelowC} °C: a frozen bed kills worms` };
  }
  if (l.lethalColdBelowC !== null && t < l.lethalColdBelowC) {
    return { status: 'lethal', reason: `below the ${l.lethalColdBelowC} °C limit, where worms die` };
  }
  if (t < l.minC) return { status: 'stressful', reason: `below the ${l.minC} °C limit` };
  if (t > l.maxC) return { status: 'stressful', reason: `above the ${l.maxC} °C limit` };
  return { status: 'within limits', reason: `within the ${l.minC}–${l.maxC} °C limits` };
}

/**
 * Moisture status of a bed: a percentage (of wet mass) or a check-in level.
 * Levels: `dry` is stressful (below the range), `damp` and `wet` are within
 * limits, `waterlogged` is stressful (beds must stay aerobic, Table 18.3).
 * Throws RangeError on a value outside 0..100, an unknown level or species.
 */
export function moistureStatus(moisture: number | MoistureLevel, species: WormSpecies = 'eisenia-fetida'): ComfortReading {
  const l = limitsOf(species);
  if (typeof moisture === 'string') {
    switch (moisture) {
      case 'dry':
        return { status: 'stressful', reason: `dry bedding, below the ${l.moistureMinPct}% limit` };
      case 'damp':
      case 'wet':
        return { status: 'within limits', reason: `${moisture} bedding` };
      case 'waterlogged':
        return { status: 'stressful', reason: 'waterlogged: the bed goes anaerobic' };
      default:
        throw new RangeError(`unknown moisture level ${String(moisture)}`);
    }
  }
  if (typeof moisture !== 'number' || !Number.isFinite(moisture) || moisture < 0 || moisture > 100) {
    throw new RangeError('moisture must be a number in 0..100');
  }
  if (moisture < l.moistureMinPct) return { status: 'stressful', reason: `below the ${l.moistureMinPct}% moisture limit` };
  if (moisture > l.moistureMaxPct) return { status: 'stressful', reason: `above the ${l.moistureMaxPct}% moisture limit` };
  return { status: 'within limits', reason: `within the ${l.moistureMinPct}–${l.moistureMaxPct}% moisture limits` };
}

const ORDER: Record<ComfortStatus, number> = { 'within limits': 0, stressful: 1, lethal: 2 };

/** Combined comfort check. */
export interface ComfortResult {
  species: WormSpecies;
  status: ComfortStatus;
  reasons: string[];
  temperature: ComfortReading | null;
  moisture: ComfortReading | null;
}

/**
 * Comfort of a bed: the worst of the temperature and moisture statuses, with
 * the reasons that are not "within limits" (or all reasons when fine).
 * Throws RangeError like tempStatus / moistureStatus, or when neither reading is given.
 */
export function checkComfort(input: {
  species?: WormSpecies;
  bedTempC?: number | null;
  moisture?: number | MoistureLevel | null;
}): ComfortResult {
  const species = input.species ?? 'eisenia-fetida';
  limitsOf(species);
  const temperature = input.bedTempC == null ? null : tempStatus(input.bedTempC, species);
  const moisture = input.moisture == null ? null : moistureStatus(input.moisture, species);
  const readings = [temperature, moisture].filter((r): r is ComfortReading => r !== null);
  if (readings.length === 0) throw new RangeError('give a bed temperature or a moisture reading');
  const status = readings.reduce<ComfortStatus>((w, r) => (ORDER[r.status] > ORDER[w] ? r.status : w), 'within limits');
  const bad = readings.filter((r) => r.status !== 'within limits');
  return { species, status, reasons: (bad.length > 0 ? bad : readings).map((r) => r.reason), temperature, moisture };
}
