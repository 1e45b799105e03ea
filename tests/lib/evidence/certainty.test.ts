import { describe, expect, it } from 'vitest';
import {
  baseGrade,
  CERTAINTY_BASE_BY_CONTRIBUTORS,
  gradeCertainty,
  IMPRECISION_MAX_WIDTH,
  IMPRECISION_MIN_TRIALS,
  INCONSISTENCY_MIN_DISAGREEMENT,
  MIN_CONTROL_SHARE,
  MIN_PHOTO_SHARE,
} from '@/lib/evidence';

const good = { finished: 10, finishedContributors: 6, withControl: 10, withPhotos: 10, disagreements: 0, successLower: 0.7, successUpper: 0.95 };

describe('certainty (GRADE terms)', () => {
  it('base grade by independent contributors', () => {
    // project rule (thresholds.ts CERTAINTY_BASE_BY_CONTRIBUTORS): ≥5 high, 3–4 moderate, 2 low, ≤1 very low
    expect(CERTAINTY_BASE_BY_CONTRIBUTORS.map((r) => r.min)).toEqual([5, 3, 2, 0]);
    expect([0, 1, 2, 3, 4, 5, 9].map(baseGrade)).toEqual(['very low', 'very low', 'low', 'moderate', 'moderate', 'high', 'high']);
    expect(gradeCertainty(good)).toStrictEqual({ grade: 'high', base: 'high', baseReason: 'started at high with finished trials from 6 independent keepers', downgrades: [] });
  });

  it('risk of bias: one level per missing safeguard, below half of trials', () => {
    // project rule: MIN_CONTROL_SHARE = MIN_PHOTO_SHARE = 0.5 (exactly half is enough)
    expect(MIN_CONTROL_SHARE).toBe(0.5);
    expect(MIN_PHOTO_SHARE).toBe(0.5);
    expect(gradeCertainty({ ...good, withControl: 5 }).grade).toBe('high');
    const noControl = gradeCertainty({ ...good, withControl: 4 });
    expect(noControl.grade).toBe('moderate');
    expect(noControl.downgrades).toEqual([{ domain: 'risk of bias', levels: 1, reasons: ['no control plot in 6 of 10 finished trials'] }]);
    const neither = gradeCertainty({ ...good, withControl: 0, withPhotos: 0 });
    expect(neither.grade).toBe('low');
    expect(neither.downgrades[0].levels).toBe(2);
  });

  it('inconsistency: a quarter of trials against the load pattern', () => {
    // project rule: INCONSISTENCY_MIN_DISAGREEMENT = 0.25, inclusive
    expect(INCONSISTENCY_MIN_DISAGREEMENT).toBe(0.25);
    expect(gradeCertainty({ ...good, disagreements: 2 }).grade).toBe('high');
    const split = gradeCertainty({ ...good, disagreements: 3, finished: 12, withControl: 12, withPhotos: 12 });
    expect(split.downgrades.map((d) => d.domain)).toEqual(['inconsistency']);
  });

  it('imprecision: fewer than 5 finished trials or an interval wider than 0.5', () => {
    // project rule: IMPRECISION_MIN_TRIALS = 5, IMPRECISION_MAX_WIDTH = 0.5 (exactly 0.5 is not too wide)
    expect(IMPRECISION_MIN_TRIALS).toBe(5);
    expect(IMPRECISION_MAX_WIDTH).toBe(0.5);
    expect(gradeCertainty({ ...good, finished: 5, withControl: 5, withPhotos: 5 }).grade).toBe('high');
    const few = gradeCertainty({ ...good, finished: 4, withControl: 4, withPhotos: 4 });
    expect(few.downgrades).toEqual([{ domain: 'imprecision', levels: 1, reasons: ['only 4 finished trials'] }]);
    expect(gradeCertainty({ ...good, successLower: 0.25, successUpper: 0.75 }).grade).toBe('high');
    const wide = gradeCertainty({ ...good, successLower: 0.2, successUpper: 0.75 });
    expect(wide.downgrades[0].reasons[0]).toBe('wide interval for the consumed share (20–75%)');
    // both reasons still one level
    const both = gradeCertainty({ ...good, finished: 3, withControl: 3, withPhotos: 3, successLower: 0.1, successUpper: 0.9 });
    expect(both.downgrades[0].levels).toBe(1);
    expect(both.downgrades[0].reasons).toHaveLength(2);
  });

  it('never below very low; no finished trials', () => {
    // GRADE terms (PRODUCT.md step 4): four levels, very low is the floor
    const worst = gradeCertainty({ finished: 2, finishedContributors: 1, withControl: 0, withPhotos: 0, disagreements: 1, successLower: 0.1, successUpper: 0.9 });
    expect(worst.grade).toBe('very low');
    const none = gradeCertainty({ finished: 0, finishedContributors: 0, withControl: 0, withPhotos: 0, disagreements: 0, successLower: null, successUpper: null });
    expect(none.grade).toBe('very low');
    expect(none.baseReason).toBe('started at very low with no finished trials');
    expect(() => gradeCertainty({ ...good, withControl: 11 })).toThrow(RangeError);
    expect(() => baseGrade(-1)).toThrow(RangeError);
  });
});
