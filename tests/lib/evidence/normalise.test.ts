import { describe, expect, it } from 'vitest';
import { dayNumber, daysBetween, lbPerYd3ToKgPerM3, LOAD_DECIMALS, normaliseDose, normaliseTrial, roundQuantity } from '@/lib/evidence';

describe('normaliseDose', () => {
  it('mass over area gives surface load', () => {
    // project rule: surface load = kg fresh feedstock / m² bed surface
    const d = normaliseDose({ dose: { amount: 3, unit: 'kg' }, area: { amount: 1.5, unit: 'm2' } });
    expect(d.surfaceLoadKgM2).toBe(2);
    expect(d.layerDepthCm).toBeNull();
    expect(d.layerDepthSource).toBeNull();
    expect(d.feedRatio).toBeNull();
  });

  it('the same dose in kg, lb and as a volume gives the same load', () => {
    // REFERENCES §5 (NIST factors) + §4 (EPA 396 lb/yd³): 1 yd³ of food scraps = 396 lb
    const density = lbPerYd3ToKgPerM3(396);
    const asLb = normaliseDose({ dose: { amount: 396, unit: 'lb' }, area: { amount: 100, unit: 'ft2' } });
    const asVolume = normaliseDose({ dose: { amount: 1, unit: 'yd3' }, area: { amount: 100, unit: 'ft2' }, bulkDensityKgM3: density });
    const asKg = normaliseDose({ dose: { amount: 396 * 0.45359237, unit: 'kg' }, area: { amount: 9.290304, unit: 'm2' } });
    expect(asVolume.surfaceLoadKgM2).toBe(asLb.surfaceLoadKgM2);
    expect(asKg.surfaceLoadKgM2).toBe(asLb.surfaceLoadKgM2);
    expect(asLb.surfaceLoadKgM2).toBeCloseTo((396 * 0.45359237) / 9.290304, 6);
  });

  it('layer depth: as entered, else estimated from volume / area', () => {
    // project rule: estimated depth = volume / area
    const est = normaliseDose({ dose: { amount: 10, unit: 'L' }, area: { amount: 0.5, unit: 'm2' }, bulkDensityKgM3: 400 });
    expect(est.layerDepthCm).toBe(2);
    expect(est.layerDepthSource).toBe('estimated');
    expect(est.surfaceLoadKgM2).toBe(8);
    const entered = normaliseDose({
      dose: { amount: 10, unit: 'L' },
      area: { amount: 0.5, unit: 'm2' },
      bulkDensityKgM3: 400,
      layerDepth: { amount: 1, unit: 'in' },
    });
    expect(entered.layerDepthCm).toBe(2.54);
    expect(entered.layerDepthSource).toBe('entered');
    // a mass dose with a density also gives an estimate
    const massDensity = normaliseDose({ dose: { amount: 4, unit: 'kg' }, area: { amount: 0.5, unit: 'm2' }, bulkDensityKgM3: 400 });
    expect(massDensity.layerDepthCm).toBe(2);
  });

  it('feed ratio when worm mass is known', () => {
    // project rule: feed ratio = kg feedstock per kg worms
    const d = normaliseDose({ dose: { amount: 1, unit: 'lb' }, area: { amount: 4, unit: 'ft2' }, wormMass: { amount: 2, unit: 'lb' } });
    expect(d.feedRatio).toBe(0.5);
  });

  it('rounds derived quantities to LOAD_DECIMALS decimals', () => {
    // project rule (thresholds.ts LOAD_DECIMALS): absorbs float noise so units cannot change a verdict
    expect(LOAD_DECIMALS).toBe(6);
    expect(roundQuantity(1.0000000000000002)).toBe(1);
    expect(roundQuantity(2.3456789)).toBe(2.345679);
    expect(Object.is(roundQuantity(-0.0000001), 0)).toBe(true);
  });

  it('throws RangeError on bad input', () => {
    // project rule: a volume needs a bulk density; amounts must be finite and > 0
    expect(() => normaliseDose({ dose: { amount: 1, unit: 'L' }, area: { amount: 1, unit: 'm2' } })).toThrow(RangeError);
    expect(() => normaliseDose({ dose: { amount: 0, unit: 'kg' }, area: { amount: 1, unit: 'm2' } })).toThrow(RangeError);
    expect(() => normaliseDose({ dose: { amount: 1, unit: 'kg' }, area: { amount: 0, unit: 'm2' } })).toThrow(RangeError);
    expect(() => normaliseDose({ dose: { amount: 1, unit: 'kg' }, area: { amount: 1, unit: 'acre' as never } })).toThrow(RangeError);
    expect(() => normaliseDose({ dose: { amount: 1, unit: 'bushel' as never }, area: { amount: 1, unit: 'm2' } })).toThrow(RangeError);
    expect(() => normaliseDose({ dose: { amount: 1, unit: 'kg' }, area: { amount: 1, unit: 'm2' }, bulkDensityKgM3: -5 })).toThrow(RangeError);
    // a load that rounds to zero (below 1 mg/m²)
    expect(() => normaliseDose({ dose: { amount: 1e-7, unit: 'kg' }, area: { amount: 1, unit: 'm2' } })).toThrow(RangeError);
  });
});

describe('normaliseTrial', () => {
  it('dose wins over a stored surface load', () => {
    // project rule (normalise.ts): the raw dose entry is normalised and wins
    const t = normaliseTrial({ id: 'a', surfaceLoadKgM2: 99, dose: { dose: { amount: 2, unit: 'kg' }, area: { amount: 1, unit: 'm2' } } });
    expect(t.surfaceLoadKgM2).toBe(2);
  });
  it('uses the stored surface load, depth and ratio otherwise', () => {
    // PRODUCT.md step 1: surface load, layer depth, feed ratio
    expect(normaliseTrial({ id: 'a', surfaceLoadKgM2: 3, layerDepthCm: 4, feedRatio: 0.5 })).toEqual({ surfaceLoadKgM2: 3, layerDepthCm: 4, feedRatio: 0.5 });
  });
  it('throws without any load', () => {
    // project rule: a trial without a surface load > 0 is a RangeError
    expect(() => normaliseTrial({ id: 'a' })).toThrow(RangeError);
    expect(() => normaliseTrial({ id: 'a', surfaceLoadKgM2: -1 })).toThrow(RangeError);
    expect(() => normaliseTrial({ id: 'a', surfaceLoadKgM2: Number.NaN })).toThrow(RangeError);
  });
});

describe('dates', () => {
  it('day numbers match the calendar', () => {
    // proleptic Gregorian calendar (ISO 8601); checked against JavaScript Date.UTC
    expect(dayNumber('1970-01-01')).toBe(0);
    expect(dayNumber('2024-02-29')).toBe(Date.UTC(2024, 1, 29) / 86_400_000);
    expect(dayNumber('2000-03-01') - dayNumber('2000-02-28')).toBe(2); // 2000 is a leap year
    expect(dayNumber('1900-03-01') - dayNumber('1900-02-28')).toBe(1); // 1900 is not
    expect(daysBetween('2024-05-01', '2024-06-19')).toBe(49);
  });
  it('rejects other formats and impossible dates', () => {
    // project rule: dates are YYYY-MM-DD calendar dates
    for (const bad of ['2023-02-29', '2024-13-01', '2024-00-10', '2024-04-31', '0000-01-01', '2024-1-01', '2024/01/01', '2024-01-01T00:00', '']) {
      expect(() => dayNumber(bad), bad).toThrow(RangeError);
    }
  });
});
