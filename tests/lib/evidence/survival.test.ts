import fc from 'fast-check';
import { product, uniqueCountSorted } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { kaplanMeier, survivalAt, type SurvivalObservation } from '@/lib/evidence';

// REFERENCES §6b: Bland & Altman 1998, BMJ 317:1572 — months to conception, 38 women.
// The full lists are from memory (M); the tails and n = 38 are V.
const conceived = [1, 1, 1, 1, 1, 1, 2, 2, 2, 2, 2, 3, 3, 3, 4, 4, 4, 6, 6, 9, 9, 9, 10, 13, 16];
const notConceived = [2, 3, 4, 7, 7, 8, 8, 9, 9, 9, 11, 24, 24];
const blandAltman: SurvivalObservation[] = [
  ...conceived.map((time) => ({ time, event: true })),
  ...notConceived.map((time) => ({ time, event: false })),
];

describe('Kaplan–Meier', () => {
  it('Bland & Altman 1998 worked example', () => {
    // REFERENCES §6b: Bland & Altman 1998, BMJ 317:1572 (lists from memory, table D)
    expect(blandAltman.length).toBe(38); // REFERENCES §6b (V): n = 38
    const km = kaplanMeier(blandAltman);
    // REFERENCES §6b table (D; matches the published table as remembered): t, at risk, events, censored, S(t)
    const rows: [number, number, number, number, number][] = [
      [1, 38, 6, 0, 0.842],
      [2, 32, 5, 1, 0.711],
      [3, 26, 3, 1, 0.629],
      [4, 22, 3, 1, 0.543],
      [6, 18, 2, 0, 0.483],
      [7, 16, 0, 2, 0.483],
      [8, 14, 0, 2, 0.483],
      [9, 12, 3, 3, 0.362],
      [10, 6, 1, 0, 0.302],
      [13, 4, 1, 0, 0.226],
      [16, 3, 1, 0, 0.151],
      [24, 2, 0, 2, 0.151],
    ];
    for (const [t, atRisk, events, censored, s] of rows) {
      const row = km.table.find((r) => r.time === t);
      expect(row, `t = ${t}`).toBeDefined();
      expect(row?.atRisk).toBe(atRisk);
      expect(row?.events).toBe(events);
      expect(row?.censored).toBe(censored);
      expect(Math.abs((row?.survival ?? -1) - s)).toBeLessThanOrEqual(0.0005);
    }
    // REFERENCES §6b test: S(16) = 0.151 ± 0.0005
    expect(Math.abs(survivalAt(km, 16) - 0.151)).toBeLessThanOrEqual(0.0005);
    // median: first time S ≤ 0.5 is t = 6 (S = 0.483)
    expect(km.median).toBe(6);
    expect(km.events).toBe(25);
    expect(km.censored).toBe(13);
  });

  it('events at a censoring time count before the censorings (t = 9)', () => {
    // REFERENCES §6b: at t = 9, 3 events and 3 censorings with 12 at risk: S drops by 3/12, not 3/9
    const km = kaplanMeier(blandAltman);
    const before = survivalAt(km, 8);
    expect(survivalAt(km, 9)).toBeCloseTo(before * (1 - 3 / 12), 12);
  });

  it('median interval by Brookmeyer–Crowley with the log-log band', () => {
    // project choice (survival.ts): pointwise log-log Greenwood band inverted at 0.5
    const km = kaplanMeier(blandAltman);
    expect(km.medianLower).not.toBeNull();
    expect(km.medianLower as number).toBeLessThanOrEqual(km.median as number);
    expect(km.medianUpper === null || (km.medianUpper as number) >= (km.median as number)).toBe(true);
    // band contains the estimate everywhere it is defined
    for (const r of km.table) {
      if (r.lower !== null) expect(r.lower).toBeLessThanOrEqual(r.survival + 1e-12);
      if (r.upper !== null) expect(r.upper).toBeGreaterThanOrEqual(r.survival - 1e-12);
    }
    // hand check at t = 1: S = 32/38, Greenwood var sum = 6/(38·32); log-log band
    const s = 32 / 38;
    const sigma = Math.sqrt(6 / (38 * 32)) / Math.abs(Math.log(s));
    expect(km.table[0].lower).toBeCloseTo(s ** Math.exp(1.96 * sigma), 12);
    expect(km.table[0].upper).toBeCloseTo(s ** Math.exp(-1.96 * sigma), 12);
  });

  it('median is the first time S(t) ≤ 0.5, even when S stays at exactly 0.5', () => {
    // project rule (thresholds.ts MEDIAN_SURVIVAL = 0.5; survival.ts): no midpoint averaging over a flat step
    const km = kaplanMeier([
      { time: 1, event: true },
      { time: 2, event: true },
      { time: 5, event: false },
      { time: 8, event: true },
    ]);
    expect(survivalAt(km, 2)).toBe(0.5);
    expect(km.median).toBe(2);
  });

  it('no events, all events, empty input', () => {
    // project rule (survival.ts): S = 0 → lower band 0, upper band undefined (null)
    expect(kaplanMeier([]).median).toBeNull();
    const none = kaplanMeier([{ time: 5, event: false }]);
    expect(none.median).toBeNull();
    expect(none.table[0].survival).toBe(1);
    const all = kaplanMeier([{ time: 3, event: true }, { time: 5, event: true }]);
    expect(all.median).toBe(3);
    expect(all.table[1].survival).toBe(0);
    expect(all.table[1].lower).toBe(0);
    expect(all.table[1].upper).toBeNull();
    expect(() => kaplanMeier([{ time: -1, event: true }])).toThrow(RangeError);
    expect(() => kaplanMeier([{ time: Number.NaN, event: true }])).toThrow(RangeError);
  });

  it('cross-check on random data against a brute-force product-limit estimate', () => {
    // No npm statistics package we have (jstat, simple-statistics) implements Kaplan–Meier, so this compares with an
    // independent brute-force product-limit computed straight from the definition: for each distinct event time u ≤ t,
    // multiply (1 − d_u / n_u) with n_u = #{time ≥ u} and d_u = #{event at u}; simple-statistics supplies product()
    // and uniqueCountSorted() for the bookkeeping.
    fc.assert(
      fc.property(
        fc.array(fc.record({ time: fc.integer({ min: 0, max: 30 }), event: fc.boolean() }), { minLength: 1, maxLength: 60 }),
        fc.integer({ min: 0, max: 35 }),
        (obs, t) => {
          const km = kaplanMeier(obs);
          const eventTimes = obs.filter((o) => o.event).map((o) => o.time).sort((a, b) => a - b);
          const distinct = [...new Set(eventTimes)].filter((u) => u <= t);
          expect(uniqueCountSorted(eventTimes)).toBe(new Set(eventTimes).size);
          const factors = distinct.map((u) => {
            const atRisk = obs.filter((o) => o.time >= u).length;
            const d = obs.filter((o) => o.event && o.time === u).length;
            return 1 - d / atRisk;
          });
          const brute = factors.length === 0 ? 1 : product(factors);
          expect(Math.abs(survivalAt(km, t) - brute)).toBeLessThan(1e-12);
          // median from the definition: smallest event time with S ≤ 0.5
          const allDistinct = [...new Set(eventTimes)];
          let median: number | null = null;
          let s = 1;
          for (const u of allDistinct) {
            s *= 1 - obs.filter((o) => o.event && o.time === u).length / obs.filter((o) => o.time >= u).length;
            if (s <= 0.5 + 1e-12) {
              median = u;
              break;
            }
          }
          expect(km.median).toBe(median);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('does not depend on input order', () => {
    // PRODUCT.md invariants: order does not matter
    const shuffled = blandAltman.slice().reverse();
    expect(kaplanMeier(shuffled)).toStrictEqual(kaplanMeier(blandAltman));
  });
});
