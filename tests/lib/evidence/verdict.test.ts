import { describe, expect, it } from 'vitest';
import {
  AVOID_MAX_ACCEPTED_SHARE,
  BASELINE_PREPARATION,
  AVOID_MIN_HARM_SHARE,
  bestGroup,
  compareVerdicts,
  FEED_MAX_HARM_SHARE,
  FEED_MIN_SUCCESS_LOWER,
  groupVerdictRule,
  isSettled,
  MIN_CONTRIBUTORS,
  MIN_FINISHED_TRIALS,
  ORDINARY_LOAD_KGM2,
  settingVerdictRule,
  VERDICT_LABELS,
  verdictLabel,
  wilson,
  type GroupRuleInput,
  type GroupVerdict,
  type Preparation,
} from '@/lib/evidence';

const feedLike: GroupRuleInput = { finished: 10, consumed: 10, partial: 0, harm: 0, successLower: wilson(10, 10).lower, ceilingKgM2: 4 };

describe('verdict order and labels', () => {
  it('feed > limit > prepare > avoid; unsettled is not ranked', () => {
    // project rule (thresholds.ts VERDICT_RANK)
    expect(compareVerdicts('feed', 'limit')).toBeGreaterThan(0);
    expect(compareVerdicts('limit', 'prepare')).toBeGreaterThan(0);
    expect(compareVerdicts('prepare', 'avoid')).toBeGreaterThan(0);
    expect(compareVerdicts('avoid', 'feed')).toBeLessThan(0);
    expect(compareVerdicts('limit', 'limit')).toBe(0);
    expect(compareVerdicts('unsettled', 'feed')).toBeNull();
    expect(compareVerdicts('avoid', 'unsettled')).toBeNull();
    expect(() => compareVerdicts('great' as never, 'feed')).toThrow(RangeError);
  });
  it('labels from PRODUCT.md', () => {
    // PRODUCT.md "Core vocabulary"
    expect(VERDICT_LABELS).toEqual({
      feed: 'Feed freely',
      limit: 'Small amounts only',
      prepare: 'Prepare first',
      avoid: 'Keep out',
      unsettled: 'Not enough evidence',
    });
    expect(verdictLabel('limit')).toBe('Small amounts only');
    expect(() => verdictLabel('x' as never)).toThrow(RangeError);
  });
});

describe('settling', () => {
  it('needs 3 finished trials from 2 contributors', () => {
    // project rule: MIN_FINISHED_TRIALS = 3, MIN_CONTRIBUTORS = 2
    expect(MIN_FINISHED_TRIALS).toBe(3);
    expect(MIN_CONTRIBUTORS).toBe(2);
    expect(isSettled(3, 2)).toBe(true);
    expect(isSettled(2, 2)).toBe(false);
    expect(isSettled(10, 1)).toBe(false);
  });
});

describe('group verdict rule', () => {
  it('no finished trials: no verdict', () => {
    // project rule (verdict.ts): no finished trials, no provisional verdict
    expect(groupVerdictRule({ finished: 0, consumed: 0, partial: 0, harm: 0, successLower: null, ceilingKgM2: null }).verdict).toBeNull();
  });

  it('feed: ceiling ≥ 2 kg/m², Wilson lower bound ≥ 0.5, harm ≤ 10 %', () => {
    // project rule: ORDINARY_LOAD_KGM2 = 2, FEED_MIN_SUCCESS_LOWER = 0.5, FEED_MAX_HARM_SHARE = 0.1
    expect(ORDINARY_LOAD_KGM2).toBe(2);
    expect(FEED_MIN_SUCCESS_LOWER).toBe(0.5);
    expect(FEED_MAX_HARM_SHARE).toBe(0.1);
    const r = groupVerdictRule(feedLike);
    expect(r.verdict).toBe('feed');
    expect(r.checks.filter((c) => c.rule.startsWith('feed')).every((c) => c.met)).toBe(true);
    // ceiling exactly at the ordinary load is enough; just below is not
    expect(groupVerdictRule({ ...feedLike, ceilingKgM2: 2 }).verdict).toBe('feed');
    expect(groupVerdictRule({ ...feedLike, ceilingKgM2: 1.999999 }).verdict).toBe('limit');
    // lower bound exactly 0.5 is enough, just below is not
    expect(groupVerdictRule({ ...feedLike, successLower: 0.5 }).verdict).toBe('feed');
    expect(groupVerdictRule({ ...feedLike, successLower: 0.4999 }).verdict).toBe('limit');
    // 4 of 4 consumed clears 0.5; 3 of 3 does not
    expect(wilson(4, 4).lower).toBeGreaterThanOrEqual(0.5);
    expect(wilson(3, 3).lower).toBeLessThan(0.5);
    // harm share exactly 10 % is allowed, more is not
    expect(groupVerdictRule({ finished: 10, consumed: 9, partial: 0, harm: 1, successLower: 0.6, ceilingKgM2: 4 }).verdict).toBe('feed');
    expect(groupVerdictRule({ finished: 9, consumed: 8, partial: 0, harm: 1, successLower: 0.6, ceilingKgM2: 4 }).verdict).toBe('limit');
  });

  it('avoid: no ceiling and harm ≥ 1/3 or accepted share < 1/2', () => {
    // project rule: AVOID_MIN_HARM_SHARE = 1/3 (inclusive), AVOID_MAX_ACCEPTED_SHARE = 0.5 (strictly below)
    expect(AVOID_MIN_HARM_SHARE).toBeCloseTo(1 / 3, 15);
    expect(AVOID_MAX_ACCEPTED_SHARE).toBe(0.5);
    const base = { finished: 6, successLower: 0, ceilingKgM2: null };
    expect(groupVerdictRule({ ...base, consumed: 0, partial: 4, harm: 2 }).verdict).toBe('avoid'); // harm 2/6 = 1/3
    expect(groupVerdictRule({ ...base, consumed: 0, partial: 5, harm: 1 }).verdict).toBe('limit'); // harm 1/6, accepted 5/6
    expect(groupVerdictRule({ ...base, consumed: 1, partial: 1, harm: 1 }).verdict).toBe('avoid'); // accepted 2/6 < 1/2
    expect(groupVerdictRule({ ...base, consumed: 1, partial: 2, harm: 0 }).verdict).toBe('limit'); // accepted 3/6 = 1/2
    // with a ceiling, harm alone does not make it avoid: fine below the ceiling → limit
    expect(groupVerdictRule({ finished: 6, consumed: 3, partial: 0, harm: 3, successLower: 0.2, ceilingKgM2: 1 }).verdict).toBe('limit');
  });

  it('names why it is not feed', () => {
    // PRODUCT.md step 4: name the thresholds crossed
    const r = groupVerdictRule({ ...feedLike, ceilingKgM2: 1 });
    expect(r.because).toContain('the ceiling of 1 kg/m² is below the ordinary load of 2 kg/m²');
    const n = groupVerdictRule({ finished: 3, consumed: 0, partial: 3, harm: 0, successLower: 0, ceilingKgM2: null });
    expect(n.verdict).toBe('limit');
    expect(n.because).toContain('no tested load was consumed reliably');
  });

  it('throws on impossible counts', () => {
    // project rule: impossible counts are a RangeError
    expect(() => groupVerdictRule({ finished: 1, consumed: 1, partial: 1, harm: 0, successLower: 0, ceilingKgM2: null })).toThrow(RangeError);
    expect(() => groupVerdictRule({ finished: -1, consumed: 0, partial: 0, harm: 0, successLower: 0, ceilingKgM2: null })).toThrow(RangeError);
  });
});

describe('setting verdict rule', () => {
  const g = (preparation: Preparation, provisional: GroupVerdict | null, finished = 5) => ({ preparation, provisional, finished });

  it('raw is the baseline preparation', () => {
    // project rule: BASELINE_PREPARATION = 'raw'
    expect(BASELINE_PREPARATION).toBe('raw');
  });

  it('raw feed or limit decides', () => {
    // project rule (verdict.ts settingVerdictRule): order feed > limit > prepare > avoid, raw first
    expect(settingVerdictRule([g('raw', 'feed'), g('pre-composted', 'avoid')])).toEqual({ verdict: 'feed', driver: 'raw' });
    expect(settingVerdictRule([g('raw', 'limit'), g('pre-composted', 'feed')])).toEqual({ verdict: 'limit', driver: 'raw' });
  });

  it('raw bad but a prepared form good → prepare', () => {
    // PRODUCT.md: "fine only after a preparation step"
    expect(settingVerdictRule([g('raw', 'avoid'), g('pre-composted', 'feed')])).toEqual({ verdict: 'prepare', driver: 'pre-composted' });
    expect(settingVerdictRule([g('raw', 'avoid'), g('soaked', 'limit')])).toEqual({ verdict: 'prepare', driver: 'soaked' });
    // no raw trials at all: a good prepared form still reads prepare
    expect(settingVerdictRule([g('chopped', 'feed')])).toEqual({ verdict: 'prepare', driver: 'chopped' });
  });

  it('avoid when nothing does better', () => {
    // PRODUCT.md vocabulary: avoid = harms worms, the bin or people at practical doses; project rule settingVerdictRule
    expect(settingVerdictRule([g('raw', 'avoid'), g('aged', 'avoid')])).toEqual({ verdict: 'avoid', driver: 'raw' });
    expect(settingVerdictRule([g('aged', 'avoid')])).toEqual({ verdict: 'avoid', driver: 'aged' });
    expect(settingVerdictRule([g('raw', null)])).toEqual({ verdict: null, driver: null });
  });

  it('tie-breaks between prepared groups: better verdict, then more finished trials, then preparation order', () => {
    // project rule (verdict.ts bestGroup)
    expect(bestGroup([g('soaked', 'limit', 9), g('aged', 'feed', 3)])?.preparation).toBe('aged');
    expect(bestGroup([g('soaked', 'feed', 4), g('aged', 'feed', 6)])?.preparation).toBe('aged');
    expect(bestGroup([g('aged', 'feed', 5), g('chopped', 'feed', 5)])?.preparation).toBe('chopped');
    expect(bestGroup([g('aged', null, 0)])).toBeNull();
  });
});
