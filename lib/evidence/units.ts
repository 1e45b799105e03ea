/**
 * Unit conversion with the exact factors of NIST SP 811 Appendix B (the 1959
 * yard-and-pound agreement): 1 lb = 0.45359237 kg, 1 in = 0.0254 m,
 * 1 US gal = 231 in³ = 3.785411784 L.
 */
import type { AreaUnit, LengthUnit, MassUnit, TemperatureUnit, VolumeUnit } from './types';

/** 1 pound (avoirdupois) in kilograms, exact. */
export const KG_PER_LB = 0.45359237;
/** 1 US gallon in litres, exact (231 in³). */
export const L_PER_GAL = 3.785411784;
/** 1 foot in metres, exact. */
export const M_PER_FT = 0.3048;
/** 1 inch in metres, exact. */
export const M_PER_IN = 0.0254;

/** kg per unit. */
export const MASS_TO_KG: Readonly<Record<MassUnit, number>> = {
  kg: 1,
  g: 0.001,
  lb: KG_PER_LB,
  oz: KG_PER_LB / 16,
};

/** litres per unit. */
export const VOLUME_TO_L: Readonly<Record<VolumeUnit, number>> = {
  L: 1,
  mL: 0.001,
  gal: L_PER_GAL,
  qt: L_PER_GAL / 4,
  m3: 1000,
  yd3: 764.554857984, // (0.9144 m)³ in litres, exact
  ft3: 28.316846592, // (0.3048 m)³ in litres, exact
};

/** m² per unit. */
export const AREA_TO_M2: Readonly<Record<AreaUnit, number>> = {
  m2: 1,
  ft2: 0.09290304, // (0.3048 m)², exact
};

/** cm per unit. */
export const LENGTH_TO_CM: Readonly<Record<LengthUnit, number>> = {
  cm: 1,
  in: 2.54,
};

function finite(value: number, what: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new RangeError(`${what} must be a finite number, got ${String(value)}`);
  }
  return value;
}

function factor<U extends string>(table: Readonly<Record<U, number>>, unit: U, kind: string): number {
  if (typeof unit !== 'string' || !Object.prototype.hasOwnProperty.call(table, unit)) {
    throw new RangeError(`unknown ${kind} unit: ${String(unit)}`);
  }
  return table[unit];
}

/** True when `unit` is a mass unit code. Throws nothing. */
export function isMassUnit(unit: string): unit is MassUnit {
  return Object.prototype.hasOwnProperty.call(MASS_TO_KG, unit);
}

/** True when `unit` is a volume unit code. Throws nothing. */
export function isVolumeUnit(unit: string): unit is VolumeUnit {
  return Object.prototype.hasOwnProperty.call(VOLUME_TO_L, unit);
}

/** Converts a mass to kilograms. Throws RangeError on an unknown unit or a non-finite value. */
export function toKg(value: number, unit: MassUnit): number {
  return finite(value, 'mass') * factor(MASS_TO_KG, unit, 'mass');
}

/** Converts a mass between units. Throws RangeError on an unknown unit or a non-finite value. */
export function convertMass(value: number, from: MassUnit, to: MassUnit): number {
  if (from === to) {
    factor(MASS_TO_KG, from, 'mass');
    return finite(value, 'mass');
  }
  return toKg(value, from) / factor(MASS_TO_KG, to, 'mass');
}

/** Converts a volume to litres. Throws RangeError on an unknown unit or a non-finite value. */
export function toLitres(value: number, unit: VolumeUnit): number {
  return finite(value, 'volume') * factor(VOLUME_TO_L, unit, 'volume');
}

/** Converts a volume to cubic metres. Throws RangeError on an unknown unit or a non-finite value. */
export function toM3(value: number, unit: VolumeUnit): number {
  return toLitres(value, unit) / 1000;
}

/** Converts a volume between units. Throws RangeError on an unknown unit or a non-finite value. */
export function convertVolume(value: number, from: VolumeUnit, to: VolumeUnit): number {
  if (from === to) {
    factor(VOLUME_TO_L, from, 'volume');
    return finite(value, 'volume');
  }
  return toLitres(value, from) / factor(VOLUME_TO_L, to, 'volume');
}

/** Converts an area to m². Throws RangeError on an unknown unit or a non-finite value. */
export function toM2(value: number, unit: AreaUnit): number {
  return finite(value, 'area') * factor(AREA_TO_M2, unit, 'area');
}

/** Converts an area between units. Throws RangeError on an unknown unit or a non-finite value. */
export function convertArea(value: number, from: AreaUnit, to: AreaUnit): number {
  if (from === to) {
    factor(AREA_TO_M2, from, 'area');
    return finite(value, 'area');
  }
  return toM2(value, from) / factor(AREA_TO_M2, to, 'area');
}

/** Converts a length to centimetres. Throws RangeError on an unknown unit or a non-finite value. */
export function toCm(value: number, unit: LengthUnit): number {
  return finite(value, 'length') * factor(LENGTH_TO_CM, unit, 'length');
}

/** Converts a length between units. Throws RangeError on an unknown unit or a non-finite value. */
export function convertLength(value: number, from: LengthUnit, to: LengthUnit): number {
  if (from === to) {
    factor(LENGTH_TO_CM, from, 'length');
    return finite(value, 'length');
  }
  return toCm(value, from) / factor(LENGTH_TO_CM, to, 'length');
}

/** °F → °C, (F − 32)/1.8 (NIST SP 811). Throws RangeError on a non-finite value. */
export function fToC(f: number): number {
  return (finite(f, 'temperature') - 32) / 1.8;
}

/** °C → °F, C × 9/5 + 32 (NIST SP 811). Throws RangeError on a non-finite value. */
export function cToF(c: number): number {
  return (finite(c, 'temperature') * 9) / 5 + 32;
}

/** Converts a temperature between °C and °F. Throws RangeError on an unknown unit or a non-finite value. */
export function convertTemperature(value: number, from: TemperatureUnit, to: TemperatureUnit): number {
  if (from !== 'C' && from !== 'F') throw new RangeError(`unknown temperature unit: ${String(from)}`);
  if (to !== 'C' && to !== 'F') throw new RangeError(`unknown temperature unit: ${String(to)}`);
  finite(value, 'temperature');
  if (from === to) return value;
  return from === 'F' ? fToC(value) : cToF(value);
}

/** Converts a temperature to °C. Throws RangeError on an unknown unit or a non-finite value. */
export function toCelsius(value: number, unit: TemperatureUnit): number {
  return convertTemperature(value, unit, 'C');
}

/**
 * Mass in kg of a volume of material with the given bulk density (kg/m³).
 * Throws RangeError on an unknown unit, a non-finite value, or a density that is not > 0.
 */
export function volumeToKg(value: number, unit: VolumeUnit, bulkDensityKgM3: number): number {
  finite(bulkDensityKgM3, 'bulk density');
  if (bulkDensityKgM3 <= 0) throw new RangeError('bulk density must be > 0 kg/m³');
  return (toLitres(value, unit) * bulkDensityKgM3) / 1000;
}

/** Bulk density lb/yd³ → kg/m³ (factor 0.45359237 / 0.764554857984). Throws RangeError on a non-finite value. */
export function lbPerYd3ToKgPerM3(lbPerYd3: number): number {
  return (finite(lbPerYd3, 'density') * KG_PER_LB * 1000) / VOLUME_TO_L.yd3;
}

/** Bulk density lb/US gal → kg/m³. Throws RangeError on a non-finite value. */
export function lbPerGalToKgPerM3(lbPerGal: number): number {
  return (finite(lbPerGal, 'density') * KG_PER_LB * 1000) / L_PER_GAL;
}

/** Areal load kg/m² → lb/ft². Throws RangeError on a non-finite value. */
export function kgPerM2ToLbPerFt2(kgPerM2: number): number {
  return (finite(kgPerM2, 'load') * AREA_TO_M2.ft2) / KG_PER_LB;
}

/** Areal load lb/ft² → kg/m². Throws RangeError on a non-finite value. */
export function lbPerFt2ToKgPerM2(lbPerFt2: number): number {
  return (finite(lbPerFt2, 'load') * KG_PER_LB) / AREA_TO_M2.ft2;
}

function trimZeros(s: string): string {
  return s.includes('.') ? s.replace(/0+$/, '').replace(/\.$/, '') : s;
}

/**
 * A load (kg/m²) or other quantity for sentences: whole numbers from 10, one
 * decimal from 1, two decimals from 0.1, two significant figures below.
 * Throws RangeError on non-finite input.
 */
export function formatLoad(x: number): string {
  if (!Number.isFinite(x)) throw new RangeError('load must be finite');
  if (x >= 10) return String(Math.round(x));
  if (x >= 1) return trimZeros(x.toFixed(1));
  if (x >= 0.1) return trimZeros(x.toFixed(2));
  return String(Number(x.toPrecision(2)));
}
