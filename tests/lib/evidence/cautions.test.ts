import { describe, expect, it } from 'vitest';
import { computeCautions, type CautionTrial } from '@/lib/evidence';

const t = (id: string, loadKgM2: number, events: string[], hasCheckIns = true): CautionTrial => ({
  id,
  loadKgM2,
  adverseEvents: events.map((event) => ({ event: event as never })),
  hasCheckIns,
});

describe('cautions', () => {
  it('"heating in 3 of 5 trials, all above 6 kg/m²"', () => {
    // PRODUCT.md "The computation" step 3: caution list with frequencies and load range
    const c = computeCautions([t('a', 2, []), t('b', 4, []), t('c', 6, []), t('d', 7, ['heating']), t('e', 9, ['heating']), t('f', 8, ['heating'])].slice(1));
    expect(c).toHaveLength(1);
    expect(c[0]).toMatchObject({ event: 'heating', trials: 3, outOf: 5, pattern: 'above', boundaryKgM2: 6, minLoadKgM2: 7, maxLoadKgM2: 9 });
    expect(c[0].text).toBe('Heating (above 30 °C) in 3 of 5 trials, all above 6 kg/m²');
    expect(c[0].trialIds).toEqual(['d', 'e', 'f']);
  });

  it('mixed and all-loads patterns', () => {
    // PRODUCT.md step 3; project rule (cautions.ts): 'mixed' gives the load range, 'all-loads' when every trial had it
    const c = computeCautions([t('a', 2, ['mould']), t('b', 5, []), t('c', 8, ['mould', 'fruit-flies']), t('d', 3, ['fruit-flies'])]);
    const mould = c.find((x) => x.event === 'mould');
    expect(mould?.pattern).toBe('mixed');
    expect(mould?.text).toBe('Mould in 2 of 4 trials, at 2–8 kg/m²');
    const all = computeCautions([t('a', 2, ['mites']), t('b', 2, ['mites'])]);
    expect(all[0].pattern).toBe('all-loads');
    expect(all[0].text).toBe('Mites in 2 of 2 trials, at every tested load (2 kg/m²)');
  });

  it('a tie at the boundary load is not "above" (the trial without the event at the same load breaks it)', () => {
    // project rule: "above" needs every trial with the event strictly above every trial without it
    const c = computeCautions([t('a', 6, []), t('b', 6, ['heating']), t('c', 8, ['heating'])]);
    expect(c[0].pattern).toBe('mixed');
  });

  it('most frequent first; ties in the fixed event order', () => {
    // project rule (cautions.ts): sort by frequency, ties in ADVERSE_EVENTS order
    const c = computeCautions([t('a', 1, ['rodents', 'mould']), t('b', 2, ['rodents', 'mould', 'heating'])]);
    expect(c.map((x) => x.event)).toEqual(['mould', 'rodents', 'heating']);
  });

  it('trials without check-ins are not in the denominator; masks work like records', () => {
    // project rule (cautions.ts): denominator = trials with at least one check-in
    const c = computeCautions([t('a', 1, ['ants']), t('b', 2, [], false)]);
    expect(c[0].outOf).toBe(1);
    const m = computeCautions([{ id: 'a', loadKgM2: 1, eventMask: 1 << 3, hasCheckIns: true }]);
    expect(m[0].event).toBe('heating');
    expect(() => computeCautions([t('a', 1, ['sunburn'])])).toThrow(RangeError);
  });
});
