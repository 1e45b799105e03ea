/** Builders for synthetic trials used across the evidence engine tests. */
import type { CheckIn, Outcome, Preparation, Setting, TrialInput, TrialStatus } from '@/lib/evidence';

/** Calendar date `days` after 2024-05-01 (UTC). */
export function dateAfter(days: number, start = '2024-05-01'): string {
  const d = new Date(Date.parse(`${start}T00:00:00Z`) + days * 86_400_000);
  return d.toISOString().slice(0, 10);
}

/** A quiet check-in: worms working, nothing adverse. Override any field. */
export function checkIn(day: number, o: Partial<CheckIn> = {}): CheckIn {
  return {
    date: dateAfter(day),
    wormActivity: 'many',
    shareRemainingPct: 50,
    bedTempC: 20,
    mould: false,
    smell: 'earthy',
    moisture: 'damp',
    pH: 7,
    pests: [],
    wormDeaths: false,
    exodus: false,
    ...o,
  };
}

export interface TrialOptions {
  id: string;
  contributorId?: string;
  setting?: Setting;
  preparation?: Preparation;
  status?: TrialStatus;
  load?: number;
  hasControl?: boolean;
  photoCount?: number;
  outcomeOverride?: Outcome | null;
  checkIns?: CheckIn[];
}

/** A trial with sensible defaults (closed, open bed, raw, 2 kg/m², control and photos). */
export function trial(o: TrialOptions): TrialInput {
  return {
    id: o.id,
    contributorId: o.contributorId ?? `keeper-${o.id}`,
    setting: o.setting ?? 'bed',
    preparation: o.preparation ?? 'raw',
    status: o.status ?? 'closed',
    startDate: '2024-05-01',
    surfaceLoadKgM2: o.load ?? 2,
    hasControl: o.hasControl ?? true,
    photoCount: o.photoCount ?? 2,
    outcomeOverride: o.outcomeOverride ?? null,
    checkIns: o.checkIns ?? [],
  };
}

/** Check-ins of a dose eaten by day 14 with nothing adverse. */
export function consumedCheckIns(): CheckIn[] {
  return [checkIn(7, { shareRemainingPct: 40 }), checkIn(14, { shareRemainingPct: 5 })];
}

/** Check-ins with worm deaths on day 7. */
export function harmCheckIns(): CheckIn[] {
  return [checkIn(7, { shareRemainingPct: 90, wormDeaths: true, wormActivity: 'few' }), checkIn(14, { shareRemainingPct: 90, wormActivity: 'none' })];
}

/** Check-ins worms never touched. */
export function rejectedCheckIns(): CheckIn[] {
  return [checkIn(7, { shareRemainingPct: 100, wormActivity: 'none' }), checkIn(21, { shareRemainingPct: 95, wormActivity: 'none' })];
}

/** Check-ins of a dose worked but not finished. */
export function partialCheckIns(): CheckIn[] {
  return [checkIn(7, { shareRemainingPct: 80, wormActivity: 'few' }), checkIn(21, { shareRemainingPct: 50 })];
}

export const outcomeCheckIns: Record<Outcome, () => CheckIn[]> = {
  consumed: consumedCheckIns,
  partial: partialCheckIns,
  rejected: rejectedCheckIns,
  harm: harmCheckIns,
};

/** A closed trial with the given outcome read off its check-ins. */
export function trialWith(outcome: Outcome, o: TrialOptions): TrialInput {
  return trial({ ...o, checkIns: o.checkIns ?? outcomeCheckIns[outcome]() });
}
