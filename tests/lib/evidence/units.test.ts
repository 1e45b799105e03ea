import { describe, expect, it } from 'vitest';
import {
  convertArea,
  countWord,
  formatLoad,
  convertLength,
  convertMass,
  convertTemperature,
  convertVolume,
  cToF,
  fToC,
  kgPerM2ToLbPerFt2,
  KG_PER_LB,
  lbPerFt2ToKgPerM2,
  lbPerGalToKgPerM3,
  lbPerYd3ToKgPerM3,
  toCm,
  toKg,
  toLitres,
  toM2,
  toM3,
  volumeToKg,
} from '@/lib/evidence';

describe('NIST SP 811 conversion factors', () => {
  it('°F ↔ °C', () => {
    // REFERENCES §5: NIST SP 811 App. B, °C = (°F − 32)/1.8 (wording from memory; exact by definition)
    expect(fToC(212)).toBe(100);
    // REFERENCES §5: NIST SP 811 — −40 °F = −40 °C exactly
    expect(fToC(-40)).toBe(-40);
    // REFERENCES §5: NIST SP 811 — 25 °C = 77 °F
    expect(cToF(25)).toBe(77);
    // REFERENCES §5: NIST SP 811 — generic conversion both ways
    expect(convertTemperature(212, 'F', 'C')).toBe(100);
    expect(convertTemperature(25, 'C', 'F')).toBe(77);
    expect(convertTemperature(30, 'C', 'C')).toBe(30);
  });

  it('US gallon is 3.785411784 L', () => {
    // REFERENCES §5: NIST SP 811 / HB44 App. C — 1 US gal = 231 in³ = 3.785411784 L (exact)
    expect(Math.abs(convertVolume(1, 'gal', 'L') - 3.785411784)).toBeLessThanOrEqual(1e-12);
    expect(Math.abs(toLitres(1, 'gal') - 3.785411784)).toBeLessThanOrEqual(1e-12);
    // REFERENCES §5: NIST — 1 US qt = 1/4 gal
    expect(Math.abs(toLitres(4, 'qt') - 3.785411784)).toBeLessThanOrEqual(1e-12);
  });

  it('1/lb is 2.20462262185 per kg', () => {
    // REFERENCES §5: NIST SP 811 — 1 lb = 0.45359237 kg exactly, so 1/lb = 2.20462262185 kg⁻¹
    expect(KG_PER_LB).toBe(0.45359237);
    expect(Math.abs(1 / toKg(1, 'lb') - 2.20462262185)).toBeLessThan(1e-11);
    expect(Math.abs(convertMass(1, 'kg', 'lb') - 2.20462262185)).toBeLessThan(1e-11);
    // REFERENCES §5: NIST — 1 oz = 1/16 lb
    expect(toKg(16, 'oz')).toBeCloseTo(0.45359237, 15);
    // SI prefixes
    expect(toKg(1500, 'g')).toBeCloseTo(1.5, 15);
  });

  it('yd³, ft³, ft², in', () => {
    // REFERENCES §5: NIST — 1 yd³ = 0.764554857984 m³ exactly
    expect(Math.abs(toM3(1, 'yd3') - 0.764554857984)).toBeLessThan(1e-15);
    // REFERENCES §5 (D): 1 yd³ = 201.974026 US gal
    expect(convertVolume(1, 'yd3', 'gal')).toBeCloseTo(201.974026, 6);
    // REFERENCES §5: NIST — 1 ft = 0.3048 m, so 1 ft³ = 0.028316846592 m³
    expect(Math.abs(toM3(1, 'ft3') - 0.028316846592)).toBeLessThan(1e-15);
    expect(convertVolume(27, 'ft3', 'yd3')).toBeCloseTo(1, 12);
    // REFERENCES §5: NIST — 1 ft² = 0.09290304 m² exactly
    expect(toM2(1, 'ft2')).toBe(0.09290304);
    expect(convertArea(1, 'm2', 'ft2')).toBeCloseTo(10.763910416709722, 12);
    // REFERENCES §5: NIST — 1 in = 0.0254 m
    expect(toCm(1, 'in')).toBe(2.54);
    expect(convertLength(2.54, 'cm', 'in')).toBeCloseTo(1, 15);
    expect(toLitres(1, 'm3')).toBe(1000);
    expect(toLitres(250, 'mL')).toBe(0.25);
  });

  it('EPA volume-to-weight factors in kg/m³', () => {
    // REFERENCES §4: EPA 2016 via ENERGY STAR — food scraps 396 lb/yd³ → 234.94 kg/m³ (factor 0.593276, exact inputs)
    expect(Math.abs(lbPerYd3ToKgPerM3(396) - 234.94)).toBeLessThanOrEqual(0.01);
    // REFERENCES §4: EPA 2016 — grass / yard trimmings 250 lb/yd³ → 148.32 kg/m³
    expect(Math.abs(lbPerYd3ToKgPerM3(250) - 148.32)).toBeLessThanOrEqual(0.01);
    // REFERENCES §4: the factor 0.45359237/0.764554857984 = 0.593276
    expect(lbPerYd3ToKgPerM3(1)).toBeCloseTo(0.593276, 6);
    // REFERENCES §4 (D): 396 lb/yd³ ≈ 1.96 lb/gal
    expect(lbPerGalToKgPerM3(1.96)).toBeCloseTo(lbPerYd3ToKgPerM3(396), -0.5);
  });

  it('stocking density 1.60 kg/m² is 0.3277 lb/ft²', () => {
    // REFERENCES §3: Ndegwa, Thompson & Das 2000 (abstract, V) — 1.60 kg worms/m² (the paper rounds to 0.33 lb/ft²)
    expect(Math.abs(kgPerM2ToLbPerFt2(1.6) - 0.3277)).toBeLessThanOrEqual(0.001);
    expect(lbPerFt2ToKgPerM2(kgPerM2ToLbPerFt2(1.6))).toBeCloseTo(1.6, 12);
  });

  it('volume to mass through a bulk density', () => {
    // REFERENCES §4 + §5: 1 yd³ of food scraps at 396 lb/yd³ weighs 396 lb
    expect(volumeToKg(1, 'yd3', lbPerYd3ToKgPerM3(396))).toBeCloseTo(396 * KG_PER_LB, 9);
    expect(() => volumeToKg(1, 'L', 0)).toThrow(RangeError);
  });

  it('throws RangeError on unknown units and non-finite values', () => {
    // project rule: unknown unit / non-finite input is a RangeError
    expect(() => toKg(1, 'stone' as never)).toThrow(RangeError);
    expect(() => toLitres(1, 'pint' as never)).toThrow(RangeError);
    expect(() => toM2(1, 'acre' as never)).toThrow(RangeError);
    expect(() => toCm(1, 'ft' as never)).toThrow(RangeError);
    expect(() => convertTemperature(1, 'K' as never, 'C')).toThrow(RangeError);
    expect(() => convertMass(1, 'kg', 'ton' as never)).toThrow(RangeError);
    expect(() => convertMass(1, 'xx' as never, 'xx' as never)).toThrow(RangeError);
    expect(() => toKg(Number.NaN, 'kg')).toThrow(RangeError);
    expect(() => toKg(Infinity, 'kg')).toThrow(RangeError);
    expect(() => fToC(Number.NaN)).toThrow(RangeError);
    expect(() => lbPerYd3ToKgPerM3(-Infinity)).toThrow(RangeError);
  });
});

describe('number words for sentences', () => {
  it('formatLoad and countWord', () => {
    // project wording rule (units.ts formatLoad, derivation.ts countWord)
    expect(formatLoad(6)).toBe('6');
    expect(formatLoad(6.04)).toBe('6');
    expect(formatLoad(12.6)).toBe('13');
    expect(formatLoad(1.24)).toBe('1.2');
    expect(formatLoad(0.25)).toBe('0.25');
    expect(formatLoad(0.0123)).toBe('0.012');
    expect(() => formatLoad(Infinity)).toThrow(RangeError);
    expect(countWord(2)).toBe('two');
    expect(countWord(12)).toBe('12');
    expect(() => countWord(-1)).toThrow(RangeError);
  });
});
