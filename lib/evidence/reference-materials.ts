/**
 * Reference C:N, %N, moisture and bulk density of common feedstocks and
 * beddings, each value with its source named (REFERENCES.md §1 and §4).
 * %N and C:N are on a dry-mass basis; moisture is % of wet mass.
 * Status: V = read in the source, V2 = read in a secondary copy,
 * M = from memory, D = derived by calculation.
 */
import { lbPerGalToKgPerM3, lbPerYd3ToKgPerM3 } from './units';

/** A number with the source it came from. */
export interface SourcedValue {
  value: number;
  source: string;
  status: 'V' | 'V2' | 'M' | 'D';
}

/** A published range, [low, high]. */
export interface SourcedRange {
  low: number;
  high: number;
  source: string;
  status: 'V' | 'V2' | 'M' | 'D';
}

/** One reference material. */
export interface ReferenceMaterial {
  id: string;
  name: string;
  role: 'feedstock' | 'bedding' | 'both';
  nitrogenPct: SourcedValue;
  cnRatio: SourcedValue;
  moisturePct: SourcedValue;
  /** Preferred bulk density, kg/m³. */
  bulkDensityKgM3: SourcedValue;
  /** Other published bulk densities, kg/m³. */
  otherBulkDensitiesKgM3: SourcedValue[];
  /** %C of dry mass where a source gives it directly. */
  carbonPct: SourcedValue | null;
  /** NRAES-54 Table A.1 ranges (REFERENCES §1b), where the material has a row. */
  ranges: { nitrogenPct: SourcedRange; cnRatio: SourcedRange; moisturePct: SourcedRange | null } | null;
}

/** REFERENCES §1a: Missouri S&T compost calculator table (drawing on the On-Farm Composting Handbook). */
export const SRC_MST = 'G. L. Bertrand, Missouri S&T compost calculator property table (REFERENCES §1a)';
/** REFERENCES §1a/§1b: NRAES-54 Appendix A, Table A.1 — from memory. */
export const SRC_NRAES = 'Rynk et al. 1992, On-Farm Composting Handbook (NRAES-54), Table A.1 (REFERENCES §1, from memory)';
/** REFERENCES §1a: Cornell spreadsheet rows. */
export const SRC_CORNELL_SHEET = 'T. Richard, Cornell "Moisture and C/N Ratio Calculation Spreadsheet" (REFERENCES §1a)';
/** REFERENCES §4: EPA 2016 volume-to-weight factors. */
export const SRC_EPA = 'US EPA ORCR Volume-to-Weight Conversion Factors (2016), via ENERGY STAR Portfolio Manager help (REFERENCES §4)';

function mst(value: number): SourcedValue {
  return { value, source: SRC_MST, status: 'V2' };
}
function nraes(value: number): SourcedValue {
  return { value, source: SRC_NRAES, status: 'M' };
}
function lbGal(lbPerGal: number): SourcedValue {
  return { value: lbPerGalToKgPerM3(lbPerGal), source: `${SRC_MST}: ${lbPerGal} lb/gal, converted`, status: 'D' };
}
function lbYd3(lbPerYd3: number, what: string): SourcedValue {
  return { value: lbPerYd3ToKgPerM3(lbPerYd3), source: `${SRC_EPA}: ${what} ${lbPerYd3} lb/yd³, converted`, status: 'D' };
}
function range(low: number, high: number): SourcedRange {
  return { low, high, source: `${SRC_NRAES} (REFERENCES §1b)`, status: 'M' };
}

/** The reference materials, in the order of REFERENCES §1a. */
export const REFERENCE_MATERIALS: readonly ReferenceMaterial[] = [
  {
    id: 'newspaper',
    name: 'Newspaper',
    role: 'bedding',
    nitrogenPct: mst(0.1),
    cnRatio: mst(650),
    moisturePct: mst(5),
    bulkDensityKgM3: lbGal(0.25),
    otherBulkDensitiesKgM3: [],
    carbonPct: { value: 62.5, source: `${SRC_CORNELL_SHEET}, newsprint row`, status: 'V2' },
    ranges: { nitrogenPct: range(0.06, 0.14), cnRatio: range(398, 852), moisturePct: range(3, 8) },
  },
  {
    id: 'cardboard',
    name: 'Corrugated cardboard',
    role: 'bedding',
    nitrogenPct: mst(0.1),
    cnRatio: nraes(563), // Missouri S&T lists 560
    moisturePct: mst(8),
    bulkDensityKgM3: lbYd3(106, 'cardboard / corrugated'),
    otherBulkDensitiesKgM3: [lbGal(0.5)],
    carbonPct: null,
    ranges: { nitrogenPct: range(0.1, 0.1), cnRatio: range(563, 563), moisturePct: range(8, 8) },
  },
  {
    id: 'sawdust',
    name: 'Sawdust',
    role: 'bedding',
    nitrogenPct: nraes(0.24), // Missouri S&T 0.2
    cnRatio: nraes(442), // Missouri S&T 440
    moisturePct: mst(39),
    bulkDensityKgM3: lbGal(2),
    otherBulkDensitiesKgM3: [],
    carbonPct: null,
    ranges: { nitrogenPct: range(0.06, 0.8), cnRatio: range(200, 750), moisturePct: range(19, 65) },
  },
  {
    id: 'straw',
    name: 'Straw',
    role: 'bedding',
    nitrogenPct: mst(0.7),
    cnRatio: mst(80),
    moisturePct: mst(12),
    bulkDensityKgM3: lbGal(1),
    otherBulkDensitiesKgM3: [],
    carbonPct: null,
    ranges: { nitrogenPct: range(0.3, 1.1), cnRatio: range(48, 150), moisturePct: range(4, 27) },
  },
  {
    id: 'leaves',
    name: 'Leaves, shredded, loose',
    role: 'both',
    nitrogenPct: mst(0.9),
    cnRatio: mst(54),
    moisturePct: mst(38),
    bulkDensityKgM3: lbGal(1),
    otherBulkDensitiesKgM3: [],
    carbonPct: null,
    ranges: { nitrogenPct: range(0.5, 1.3), cnRatio: range(40, 80), moisturePct: range(38, 38) },
  },
  {
    id: 'horse-manure',
    name: 'Horse manure',
    role: 'both',
    nitrogenPct: mst(1.6),
    cnRatio: mst(30),
    moisturePct: mst(72),
    bulkDensityKgM3: lbGal(6.8),
    otherBulkDensitiesKgM3: [],
    carbonPct: null,
    ranges: { nitrogenPct: range(1.4, 2.3), cnRatio: range(22, 50), moisturePct: range(59, 79) },
  },
  {
    id: 'coffee-grounds',
    name: 'Coffee grounds',
    role: 'feedstock',
    nitrogenPct: mst(2),
    cnRatio: mst(20),
    moisturePct: mst(80),
    bulkDensityKgM3: lbGal(7),
    otherBulkDensitiesKgM3: [],
    carbonPct: null,
    ranges: null,
  },
  {
    id: 'cattle-manure',
    name: 'Cattle manure',
    role: 'feedstock',
    nitrogenPct: mst(2.4),
    cnRatio: mst(19),
    moisturePct: { value: 81, source: `${SRC_MST}; also ${SRC_CORNELL_SHEET}`, status: 'V2' },
    bulkDensityKgM3: lbGal(7.2),
    otherBulkDensitiesKgM3: [],
    carbonPct: { value: 45.6, source: `${SRC_CORNELL_SHEET}, cattle manure row`, status: 'V2' },
    ranges: { nitrogenPct: range(1.5, 4.2), cnRatio: range(11, 30), moisturePct: range(67, 87) },
  },
  {
    id: 'grass-clippings',
    name: 'Grass clippings, loose',
    role: 'feedstock',
    nitrogenPct: mst(4), // NRAES typical 3.4 (from memory)
    cnRatio: mst(17),
    moisturePct: mst(82),
    bulkDensityKgM3: lbYd3(250, 'grass / yard trimmings'),
    otherBulkDensitiesKgM3: [lbGal(1.7)],
    carbonPct: null,
    ranges: { nitrogenPct: range(2, 6), cnRatio: range(9, 25), moisturePct: null },
  },
  {
    id: 'food-scraps',
    name: 'Table (food) scraps',
    role: 'feedstock',
    nitrogenPct: mst(2.4),
    cnRatio: mst(15),
    moisturePct: mst(70),
    bulkDensityKgM3: lbYd3(396, 'food / food scraps'),
    otherBulkDensitiesKgM3: [lbGal(3.5)],
    carbonPct: null,
    ranges: null,
  },
  {
    id: 'garden-waste',
    name: 'Garden waste',
    role: 'feedstock',
    nitrogenPct: mst(3.2),
    cnRatio: mst(12),
    moisturePct: mst(65),
    bulkDensityKgM3: lbGal(3),
    otherBulkDensitiesKgM3: [],
    carbonPct: null,
    ranges: null,
  },
];

/** A reference material by id. Throws RangeError on an unknown id. */
export function referenceMaterial(id: string): ReferenceMaterial {
  const m = REFERENCE_MATERIALS.find((x) => x.id === id);
  if (!m) throw new RangeError(`unknown reference material ${id}`);
  return m;
}
