import { describe, expect, it } from 'vitest';
import {
  ACIDITY_PH,
  ALKALINITY_PH,
  checkInEvents,
  classifyTrial,
  CONSUMED_MAX_REMAINING_PCT,
  CONSUMPTION_WINDOW_DAYS,
  HEATING_FLAG_C,
  LETHAL_HEAT_C,
  summariseTrial,
  eventsInMask,
} from '@/lib/evidence';
import { checkIn, consumedCheckIns, trial } from './helpers';

const events = (c: Parameters<typeof checkIn>[1]) => checkInEvents(checkIn(7, c));

describe('adverse-event thresholds', () => {
  it('heating strictly above 30 °C; lethal heat at 35 °C or more', () => {
    // REFERENCES §3: Edwards (ed.) 2004 Table 18.3, upper limit 30 °C (V2); TRADE §6 "flag above 30 °C"
    expect(HEATING_FLAG_C).toBe(30);
    expect(events({ bedTempC: 30 })).toEqual([]);
    expect(events({ bedTempC: 30.1 })).toEqual(['heating']);
    // REFERENCES §3: Loehr, Neuhauser & Malecki 1985 — worms die at 35 °C (V abstract)
    expect(LETHAL_HEAT_C).toBe(35);
    expect(events({ bedTempC: 34.9 })).toEqual(['heating']);
    expect(events({ bedTempC: 35 })).toEqual(['lethal-heat', 'heating']);
    expect(events({ bedTempC: null })).toEqual([]);
  });

  it('acidity below pH 5, alkalinity above pH 9', () => {
    // REFERENCES §3: Table 18.3 — pH > 5 and < 9 (V2); TRADE §6 flag below 5 or above 9
    expect(ACIDITY_PH).toBe(5);
    expect(ALKALINITY_PH).toBe(9);
    expect(events({ pH: 5 })).toEqual([]);
    expect(events({ pH: 4.9 })).toEqual(['acidity']);
    expect(events({ pH: 9 })).toEqual([]);
    expect(events({ pH: 9.1 })).toEqual(['alkalinity']);
  });

  it('smells, mould, waterlogging', () => {
    // PRODUCT.md "The computation" step 2: sour or rotten smell, mould, waterlogging are adverse events
    expect(events({ smell: 'sour' })).toEqual(['sour-smell']);
    expect(events({ smell: 'rotten' })).toEqual(['rotten-smell']);
    // TRADE §3: high-nitrogen bedding releases ammonia (V*); REFERENCES §3 Table 18.3 ammonia < 0.5 mg/g
    expect(events({ smell: 'ammonia' })).toEqual(['ammonia-smell']);
    expect(events({ smell: 'earthy' })).toEqual([]);
    expect(events({ smell: 'none' })).toEqual([]);
    expect(events({ mould: true })).toEqual(['mould']);
    expect(events({ moisture: 'waterlogged' })).toEqual(['waterlogging']);
    expect(events({ moisture: 'wet' })).toEqual([]);
    expect(events({ moisture: 'dry' })).toEqual([]);
  });

  it('pests are events; springtails are not', () => {
    // TRADE §5: land flatworms prey on earthworms (V), mites (V), fruit flies (V), gnats (M), ants and rodents (V; M)
    expect(events({ pests: ['flatworms', 'mites', 'fruit-flies', 'fungus-gnats', 'ants', 'rodents'] })).toEqual([
      'flatworms',
      'mites',
      'fruit-flies',
      'fungus-gnats',
      'ants',
      'rodents',
    ]);
    // REFERENCES §9 + TRADE §5: springtails are harmless decomposers — common practice (no published source)
    expect(events({ pests: ['springtails'] })).toEqual([]);
    const c = classifyTrial(trial({ id: 's', checkIns: [checkIn(7, { pests: ['springtails'] })] }));
    expect(c.adverseEvents).toEqual([]);
    expect(c.harmless).toEqual(['springtails']);
  });

  it('deaths and exodus are events', () => {
    // PRODUCT.md step 2: harm = deaths, mass exodus
    expect(events({ wormDeaths: true })).toEqual(['worm-deaths']);
    expect(events({ exodus: true })).toEqual(['exodus']);
  });

  it('first day of each event, ordered by day then fixed event order', () => {
    // project rule (outcome.ts): first day per event; ties in ADVERSE_EVENTS order
    const c = classifyTrial(
      trial({
        id: 'a',
        checkIns: [
          checkIn(21, { bedTempC: 33, mould: true }),
          checkIn(7, { mould: true, smell: 'sour' }),
          checkIn(14, { bedTempC: 31 }),
        ],
      }),
    );
    expect(c.adverseEvents).toEqual([
      { event: 'sour-smell', firstDay: 7 },
      { event: 'mould', firstDay: 7 },
      { event: 'heating', firstDay: 14 },
    ]);
  });
});

describe('outcome rules', () => {
  it('consumed at ≤ 10 % left with worms working it, within 28 days', () => {
    // project rule (thresholds.ts): CONSUMED_MAX_REMAINING_PCT = 10, CONSUMPTION_WINDOW_DAYS = 28
    expect(CONSUMED_MAX_REMAINING_PCT).toBe(10);
    expect(CONSUMPTION_WINDOW_DAYS).toBe(28);
    const at = (share: number, day: number) =>
      classifyTrial(trial({ id: 'c', checkIns: [checkIn(7, { shareRemainingPct: 60 }), checkIn(day, { shareRemainingPct: share })] }));
    expect(at(10, 14).outcome).toBe('consumed');
    expect(at(10, 14).daysToConsumption).toBe(14);
    expect(at(11, 14).outcome).toBe('partial');
    expect(at(11, 14).daysToConsumption).toBeNull();
    expect(at(5, 28).outcome).toBe('consumed');
    const late = at(5, 29);
    expect(late.outcome).toBe('partial');
    expect(late.daysToConsumption).toBe(29); // still an event for time to consumption
    expect(late.censored).toBe(false);
    expect(late.reasons.join(' ')).toContain('after the 28-day window');
  });

  it('consumption counts only once worms have been seen', () => {
    // project rule: "consumed (little left, worms working it)"
    const c = classifyTrial(
      trial({
        id: 'w',
        checkIns: [checkIn(7, { shareRemainingPct: 5, wormActivity: 'none' }), checkIn(14, { shareRemainingPct: 5, wormActivity: 'few' })],
      }),
    );
    expect(c.daysToConsumption).toBe(14);
    expect(c.outcome).toBe('consumed');
    const never = classifyTrial(trial({ id: 'n', checkIns: [checkIn(7, { shareRemainingPct: 0, wormActivity: 'none' })] }));
    expect(never.outcome).toBe('rejected');
    expect(never.daysToConsumption).toBeNull();
  });

  it('harm from deaths or exodus wins over consumption (tie-break)', () => {
    // project rule (outcome.ts rule 2 before rule 3)
    const c = classifyTrial(trial({ id: 'h', checkIns: [checkIn(7, { shareRemainingPct: 5 }), checkIn(14, { exodus: true, shareRemainingPct: 0 })] }));
    expect(c.outcome).toBe('harm');
    expect(c.daysToConsumption).toBe(7);
    expect(c.reasons[0]).toContain('worms left the bed on day 14');
  });

  it('closed: rejected when worms never came, else partial', () => {
    // PRODUCT.md step 2: rejected = worms stayed away to the end
    expect(classifyTrial(trial({ id: 'r', checkIns: [checkIn(7, { wormActivity: 'none', shareRemainingPct: 100 })] })).outcome).toBe('rejected');
    const p = classifyTrial(trial({ id: 'p', checkIns: [checkIn(7, { wormActivity: 'few', shareRemainingPct: 60 })] }));
    expect(p.outcome).toBe('partial');
    expect(p.reasons[0]).toContain('60% was left');
  });

  it('running and abandoned: only decisive evidence gives an outcome', () => {
    // PRODUCT.md step 3: running or abandoned trials are censored, not dropped; project rule: outcome null until decisive
    for (const status of ['running', 'abandoned'] as const) {
      expect(classifyTrial(trial({ id: 'x', status, checkIns: [checkIn(7, { wormActivity: 'none', shareRemainingPct: 100 })] })).outcome).toBeNull();
      expect(classifyTrial(trial({ id: 'x', status, checkIns: consumedCheckIns() })).outcome).toBe('consumed');
      expect(classifyTrial(trial({ id: 'x', status, checkIns: [checkIn(7, { wormDeaths: true })] })).outcome).toBe('harm');
      const open = classifyTrial(trial({ id: 'x', status, checkIns: [checkIn(7, { shareRemainingPct: 60 }), checkIn(35, { shareRemainingPct: 30 })] }));
      expect(open.outcome).toBeNull();
      expect(open.censored).toBe(true);
      expect(open.followUpDays).toBe(35);
    }
  });

  it('no check-ins: no outcome, no follow-up', () => {
    // project rule (outcome.ts): no check-ins, no evidence
    const c = classifyTrial(trial({ id: 'e', checkIns: [] }));
    expect(c.outcome).toBeNull();
    expect(c.followUpDays).toBeNull();
    expect(c.censored).toBe(true);
  });

  it("the owner's confirmed outcome wins", () => {
    // project rule (brief): outcomeOverride wins over the classifier
    const c = classifyTrial(trial({ id: 'o', outcomeOverride: 'partial', checkIns: consumedCheckIns() }));
    expect(c.outcome).toBe('partial');
    expect(c.outcomeSource).toBe('owner');
    expect(c.reasons[0]).toContain('check-ins alone would give consumed');
    // consumed on the owner's word: time taken as the last check-in
    const o = classifyTrial(trial({ id: 'o2', status: 'running', outcomeOverride: 'consumed', checkIns: [checkIn(9, { shareRemainingPct: 30 })] }));
    expect(o.outcome).toBe('consumed');
    expect(o.daysToConsumption).toBe(9);
    expect(o.censored).toBe(false);
    expect(classifyTrial(trial({ id: 'o3', outcomeOverride: 'harm', checkIns: [] })).outcome).toBe('harm');
  });

  it('does not depend on the order of check-ins', () => {
    // PRODUCT.md invariants: order does not matter
    const ins = [checkIn(21, { shareRemainingPct: 8, pests: ['mites'] }), checkIn(7, { shareRemainingPct: 70, bedTempC: 31 }), checkIn(14, { shareRemainingPct: 30, mould: true })];
    const a = classifyTrial(trial({ id: 'a', checkIns: ins }));
    const b = classifyTrial(trial({ id: 'a', checkIns: [ins[2], ins[0], ins[1]] }));
    expect(b).toStrictEqual(a);
  });

  it('summariseTrial agrees with classifyTrial', () => {
    // project rule: one set of outcome rules (outcome.ts) for both entry points
    const t = trial({ id: 'a', checkIns: [checkIn(7, { bedTempC: 36, pests: ['springtails'] }), checkIn(14, { shareRemainingPct: 3 })] });
    const c = classifyTrial(t);
    const s = summariseTrial(t);
    expect(s.outcome).toBe(c.outcome);
    expect(s.daysToConsumption).toBe(c.daysToConsumption);
    expect(s.followUpDays).toBe(c.followUpDays);
    expect(s.springtails).toBe(true);
    expect(eventsInMask(s.eventMask).sort()).toEqual(c.adverseEvents.map((e) => e.event).sort());
  });

  it('throws RangeError on bad input', () => {
    // project rule: invalid input is a RangeError
    expect(() => classifyTrial(trial({ id: 'b', checkIns: [checkIn(-1)] }))).toThrow(RangeError); // before the start
    expect(() => classifyTrial(trial({ id: 'b', checkIns: [checkIn(1, { shareRemainingPct: 101 })] }))).toThrow(RangeError);
    expect(() => classifyTrial(trial({ id: 'b', checkIns: [checkIn(1, { shareRemainingPct: Number.NaN })] }))).toThrow(RangeError);
    expect(() => classifyTrial(trial({ id: 'b', checkIns: [checkIn(1, { smell: 'sweet' as never })] }))).toThrow(RangeError);
    expect(() => classifyTrial(trial({ id: 'b', checkIns: [checkIn(1, { pests: ['beetles' as never] })] }))).toThrow(RangeError);
    expect(() => classifyTrial(trial({ id: 'b', checkIns: [checkIn(1, { pH: 15 })] }))).toThrow(RangeError);
    expect(() => classifyTrial(trial({ id: 'b', checkIns: [checkIn(1, { date: '2024-5-1' })] }))).toThrow(RangeError);
    expect(() => classifyTrial({ ...trial({ id: 'b' }), status: 'paused' as never })).toThrow(RangeError);
    expect(() => classifyTrial({ ...trial({ id: 'b' }), outcomeOverride: 'great' as never })).toThrow(RangeError);
  });
});
