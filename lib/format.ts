import { kgPerM2ToLbPerFt2 } from '@/lib/evidence/units';

/** How a reader wants loads shown. */
export type Units = 'metric' | 'imperial';

/** A number to at most `digits` significant figures, without trailing zeros ("0.31", "12", "1.5"). */
export function formatNumber(x: number, digits = 2): string {
  if (!Number.isFinite(x)) return '—';
  if (x === 0) return '0';
  const abs = Math.abs(x);
  if (abs >= 100) return String(Math.round(x));
  const rounded = Number(x.toPrecision(digits));
  return abs >= 10 ? String(Math.round(rounded * 10) / 10) : String(rounded);
}

/** A surface load in the reader's units: "1.5 kg/m²" or "0.31 lb/ft²" (1 lb = 0.45359237 kg, 1 ft² = 0.09290304 m²). */
export function formatLoad(kgM2: number, units: Units): string {
  return units === 'imperial' ? `${formatNumber(kgPerM2ToLbPerFt2(kgM2))} lb/ft²` : `${formatNumber(kgM2)} kg/m²`;
}

/** The unit label alone. */
export function loadUnit(units: Units): string {
  return units === 'imperial' ? 'lb/ft²' : 'kg/m²';
}

/** Converts a load to the reader's units (a number, for charts). */
export function loadIn(kgM2: number, units: Units): number {
  return units === 'imperial' ? kgPerM2ToLbPerFt2(kgM2) : kgM2;
}

/**
 * Engine sentences quote loads in kg/m²; for imperial readers each one gets
 * its lb/ft² value added: "above 6 kg/m²" → "above 6 kg/m² (1.2 lb/ft²)".
 */
export function withReaderUnits(sentence: string, units: Units): string {
  if (units === 'metric') return sentence;
  return sentence.replace(/(\d+(?:\.\d+)?) kg\/m²/g, (m, n: string) => `${m} (${formatNumber(kgPerM2ToLbPerFt2(Number(n)))} lb/ft²)`);
}

/** A calendar date for readers, "15 Jan 2026" (UTC, so every server prints the same). */
export function formatDate(iso: string): string {
  const d = new Date(iso.length === 10 ? `${iso}T00:00:00Z` : iso);
  if (Number.isNaN(d.getTime())) return iso;
  return new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' }).format(d);
}
