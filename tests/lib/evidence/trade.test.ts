/**
 * Trade facts with no published source (REFERENCES §9): every check here is
 * // common practice (no published source). The citrus data are synthetic.
 */
import { describe, expect, it } from 'vitest';
import { aggregateFeedstock, compareVerdicts, cToF, type CheckIn, type TrialInput } from '@/lib/evidence';
import { checkIn } from './helpers';

/** An extreme, thick dose of citrus peel over an open bed: a 20 L bucket over 0.3 m² (density illustrative, 300 kg/m³). */
function thickPeelTrial(id: string, keeper: string, goneDay: number | null, lastDay = goneDay ?? 35): TrialInput {
  const ins: CheckIn[] = [];
  for (let day = 7; day <= lastDay; day += 7) {
    const week = day / 7;
    // worms stay out for three weeks or more, move in around week five, most of it gone around week seven
    const worms = week <= 4 ? 'none' : week === 5 ? 'few' : 'many';
    const share = goneDay !== null && day >= goneDay ? 8 : week <= 3 ? 100 : week === 4 ? 95 : week === 5 ? 75 : 45;
    ins.push(checkIn(day, { wormActivity: worms, shareRemainingPct: share, bedTempC: week <= 2 ? 33 : 24, mould: week === 3 }));
  }
  return {
    id,
    contributorId: keeper,
    setting: 'bed',
    preparation: 'raw',
    status: goneDay === null ? 'running' : 'closed',
    startDate: '2024-05-01',
    dose: { dose: { amount: 20, unit: 'L' }, area: { amount: 0.3, unit: 'm2' }, bulkDensityKgM3: 300 },
    hasControl: true,
    photoCount: 3,
    checkIns: ins,
  };
}

const thick = [
  thickPeelTrial('peel-1', 'k1', 42),
  thickPeelTrial('peel-2', 'k2', 49),
  thickPeelTrial('peel-3', 'k3', 49),
  thickPeelTrial('peel-4', 'k4', 56),
  thickPeelTrial('peel-5', 'k1', 56),
  thickPeelTrial('peel-6', 'k2', null, 35), // still running, censored at day 35
];

/** The same feedstock at an ordinary small load (2 kg/m²) in the same setting, eaten within two weeks. */
const small = Array.from({ length: 6 }, (_, i): TrialInput => ({
  id: `small-${i}`,
  contributorId: `k${(i % 4) + 1}`,
  setting: 'bed',
  preparation: 'raw',
  status: 'closed',
  startDate: '2024-05-01',
  surfaceLoadKgM2: 2,
  hasControl: true,
  photoCount: 2,
  checkIns: [checkIn(7, { shareRemainingPct: 50 }), checkIn(14, { shareRemainingPct: 5 })],
}));

describe('trade facts (common practice)', () => {
  it('38 °C reads as just over 100 °F', () => {
    // common practice (no published source): REFERENCES §9 — 38 °C is exactly 100.4 °F
    expect(cToF(38)).toBeCloseTo(100.4, 10);
    expect(cToF(38)).toBeGreaterThan(100);
  });

  it('an extreme thick citrus-peel dose on open beds: slow, heating, no better than Small amounts only', () => {
    // common practice (no published source): REFERENCES §9 — worms absent three weeks or more, moving in
    // after about five weeks, the peel mostly gone after about seven; a thick layer heats up
    const r = aggregateFeedstock(thick);
    const g = r.groups[0];
    expect(g.key).toBe('bed/raw');
    expect(g.ceiling.highestTestedKgM2).toBe(20); // 20 L × 300 kg/m³ / 0.3 m²
    const km = g.timeToConsumption;
    expect(km.median).not.toBeNull();
    expect(km.median as number).toBeGreaterThanOrEqual(42);
    expect(km.median as number).toBeLessThanOrEqual(56);
    expect(km.censored).toBe(1); // the running trial is kept, censored
    expect(g.cautions.map((c) => c.event)).toContain('heating');
    expect(g.settled).toBe(true);
    expect(compareVerdicts(g.verdict, 'limit') as number).toBeLessThanOrEqual(0);
  });

  it('the same feedstock at a small load in the same setting comes out better', () => {
    // common practice (no published source): REFERENCES §9 — worms eat it once microbes have broken it down;
    // large amounts are the problem, not the feedstock
    const atSmall = aggregateFeedstock(small).groups[0];
    const atThick = aggregateFeedstock(thick).groups[0];
    expect(atSmall.verdict).toBe('feed');
    expect(compareVerdicts(atSmall.verdict, atThick.verdict) as number).toBeGreaterThan(0);
    // both together: the ceiling sits at the small load, well below the thick dose
    const both = aggregateFeedstock([...thick, ...small]).groups[0];
    expect(both.verdict).toBe('limit');
    expect(both.ceiling.kgM2).toBe(2);
    expect(both.ceiling.nextLoadAboveKgM2).toBe(20);
    expect(both.cautions.find((c) => c.event === 'heating')?.text).toBe('Heating (above 30 °C) in 6 of 12 trials, all above 2 kg/m²');
  });
});
