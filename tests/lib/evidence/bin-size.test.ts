import { describe, expect, it } from 'vitest';
import { binArea, binAreaFt2, binAreaM2, dailyFeed, DEFAULT_FEED_RATE, suggestBin, suggestBox, SUGGESTED_DEPTH_IN, wormMassForFeed } from '@/lib/evidence';

describe('bin sizing', () => {
  it('1 ft² per lb of scraps per week', () => {
    // REFERENCES §3: NC State Extension AG-473-18 — 2 people ≈ 3.5 lb/week → 3.5 ft², fits a 2 × 2 ft box (V)
    expect(binArea(3.5)).toBe(3.5);
    expect(suggestBox(3.5)).toEqual({ widthFt: 2, lengthFt: 2, areaFt2: 4 });
    // REFERENCES §3: AG-473-18 — 4–6 people ≈ 6 lb/week → 6 ft², a 2 × 3 ft box (V)
    expect(binAreaFt2(6)).toBe(6);
    expect(suggestBox(6)).toEqual({ widthFt: 2, lengthFt: 3, areaFt2: 6 });
    // REFERENCES §3 + §5: the same rule in metric (1 lb/ft² per week ≈ 4.88 kg/m²)
    expect(binAreaM2(0.45359237 * 3.5)).toBeCloseTo(3.5 * 0.09290304, 12);
  });

  it('box tie-break: the squarer box of equal area', () => {
    // project rule (bin-size.ts suggestBox): 1 × 4 and 2 × 2 both give 4 ft² → 2 × 2
    expect(suggestBox(4)).toEqual({ widthFt: 2, lengthFt: 2, areaFt2: 4 });
    expect(suggestBox(0)).toEqual({ widthFt: 1, lengthFt: 1, areaFt2: 1 });
    expect(suggestBox(10)).toEqual({ widthFt: 3, lengthFt: 4, areaFt2: 12 });
  });

  it('daily feed from worm mass and rate', () => {
    // REFERENCES §3: Ndegwa, Thompson & Das 2000 (abstract, V) — 0.75 kg feed per kg worms per day
    expect(dailyFeed(1, 0.75)).toBe(0.75);
    // REFERENCES §3: Munroe — feed about half the worm body weight per day (from memory); common practice
    expect(DEFAULT_FEED_RATE).toBe(0.5);
    expect(wormMassForFeed(0.5)).toBe(1);
    expect(() => wormMassForFeed(1, 0)).toThrow(RangeError);
    expect(() => dailyFeed(-1, 0.5)).toThrow(RangeError);
  });

  it('a full suggestion', () => {
    // REFERENCES §3: AG-473-18 example box 8 in deep (V); worm mass at half body weight a day (Munroe, from memory)
    const s = suggestBin({ amount: 3.5, unit: 'lb' });
    expect(s.areaFt2).toBeCloseTo(3.5, 12);
    expect(s.box).toEqual({ widthFt: 2, lengthFt: 2, areaFt2: 4 });
    expect(s.depthIn).toBe(SUGGESTED_DEPTH_IN);
    expect(s.depthCm).toBeCloseTo(20.32, 12);
    expect(s.wormMassLb).toBeCloseTo(1, 12); // 0.5 lb food a day at 0.5 → 1 lb worms
    expect(() => suggestBin({ amount: 1, unit: 'stone' as never })).toThrow(RangeError);
    expect(() => binArea(-1)).toThrow(RangeError);
  });
});
