/**
 * Trial outcome classification: every rule that turns check-ins into an
 * outcome and adverse events lives here (thresholds in thresholds.ts).
 *
 * Rules, in order:
 * 1. The owner's confirmed outcome (`outcomeOverride`) wins.
 * 2. `harm`: any check-in reports worm deaths or a mass exodus — decisive at any status.
 * 3. `consumed`: at most CONSUMED_MAX_REMAINING_PCT % left, with worms seen at or
 *    before that check-in, within CONSUMPTION_WINDOW_DAYS of the start — decisive at any status.
 * 4. Closed trials otherwise: `rejected` when no check-in ever saw worms in the
 *    feedstock (they stayed away to the end), else `partial`.
 * 5. Running and abandoned trials otherwise have no outcome yet (`null`).
 * A trial with no check-ins has no outcome unless the owner confirmed one.
 *
 * The result does not depend on the order of check-ins: every rule is a
 * minimum, maximum or "any" over days.
 */
import { dayNumber } from './normalise';
import {
  ACIDITY_PH,
  ALKALINITY_PH,
  CONSUMED_MAX_REMAINING_PCT,
  CONSUMPTION_WINDOW_DAYS,
  HEATING_FLAG_C,
  LETHAL_HEAT_C,
} from './thresholds';
import type { AdverseEvent, AdverseEventRecord, CheckIn, Outcome, Pest, TrialClassification, TrialInput } from './types';

/** Every adverse event, in the fixed order used for ties and listings. */
export const ADVERSE_EVENTS: readonly AdverseEvent[] = [
  'worm-deaths',
  'exodus',
  'lethal-heat',
  'heating',
  'acidity',
  'alkalinity',
  'sour-smell',
  'rotten-smell',
  'ammonia-smell',
  'mould',
  'waterlogging',
  'flatworms',
  'mites',
  'fruit-flies',
  'fungus-gnats',
  'ants',
  'rodents',
];

/** Pests that are adverse events (springtails are harmless decomposers — TRADE §5, from memory). */
export const ADVERSE_PESTS: readonly Pest[] = ['flatworms', 'mites', 'fruit-flies', 'fungus-gnats', 'ants', 'rodents'];

/** Organisms recorded but not adverse. */
export const HARMLESS_PESTS: readonly Pest[] = ['springtails'];

const ALL_PESTS: readonly Pest[] = [...ADVERSE_PESTS, ...HARMLESS_PESTS];

const EVENT_INDEX: Record<AdverseEvent, number> = Object.fromEntries(
  ADVERSE_EVENTS.map((e, i) => [e, i]),
) as Record<AdverseEvent, number>;

const OUTCOMES: readonly Outcome[] = ['consumed', 'partial', 'rejected', 'harm'];

const WORM_ACTIVITY = new Set(['none', 'few', 'many', 'swarming']);
const SMELLS = new Set(['none', 'earthy', 'sour', 'rotten', 'ammonia']);
const MOISTURE = new Set(['dry', 'damp', 'wet', 'waterlogged']);

/** Plain-English name of an adverse event, for sentences. */
export const ADVERSE_EVENT_WORDS: Readonly<Record<AdverseEvent, string>> = {
  'worm-deaths': 'worm deaths',
  exodus: 'worms leaving',
  'lethal-heat': `heat at the lethal level (${LETHAL_HEAT_C} °C or more)`,
  heating: `heating (above ${HEATING_FLAG_C} °C)`,
  acidity: `acidity (pH below ${ACIDITY_PH})`,
  alkalinity: `alkalinity (pH above ${ALKALINITY_PH})`,
  'sour-smell': 'a sour smell',
  'rotten-smell': 'a rotten smell',
  'ammonia-smell': 'an ammonia smell',
  mould: 'mould',
  waterlogging: 'waterlogging',
  flatworms: 'land flatworms',
  mites: 'mites',
  'fruit-flies': 'fruit flies',
  'fungus-gnats': 'fungus gnats',
  ants: 'ants',
  rodents: 'rodents',
};

function checkNumber(x: unknown, lo: number, hi: number, what: string, trialId: string): number {
  if (typeof x !== 'number' || !Number.isFinite(x) || x < lo || x > hi) {
    throw new RangeError(`trial ${trialId}: ${what} must be a number in ${lo}..${hi}, got ${String(x)}`);
  }
  return x;
}

/** Validates one outcome code; throws RangeError on anything else. */
export function assertOutcome(x: unknown): Outcome {
  if (!OUTCOMES.includes(x as Outcome)) throw new RangeError(`unknown outcome: ${String(x)}`);
  return x as Outcome;
}

/**
 * Adverse events a single check-in shows (no days). Useful for the check-in
 * screen. Throws RangeError on out-of-range readings.
 */
export function checkInEvents(c: CheckIn, trialId = '?'): AdverseEvent[] {
  const out: AdverseEvent[] = [];
  const seen = new Array<boolean>(ADVERSE_EVENTS.length).fill(false);
  readCheckIn(c, trialId, (e) => {
    seen[EVENT_INDEX[e]] = true;
  });
  for (let i = 0; i < seen.length; i++) if (seen[i]) out.push(ADVERSE_EVENTS[i]);
  return out;
}

function readCheckIn(c: CheckIn, trialId: string, mark: (e: AdverseEvent) => void): void {
  if (!WORM_ACTIVITY.has(c.wormActivity)) throw new RangeError(`trial ${trialId}: unknown worm activity ${String(c.wormActivity)}`);
  if (!SMELLS.has(c.smell)) throw new RangeError(`trial ${trialId}: unknown smell ${String(c.smell)}`);
  if (!MOISTURE.has(c.moisture)) throw new RangeError(`trial ${trialId}: unknown moisture ${String(c.moisture)}`);
  checkNumber(c.shareRemainingPct, 0, 100, 'share remaining (%)', trialId);
  if (c.wormDeaths === true) mark('worm-deaths');
  if (c.exodus === true) mark('exodus');
  if (c.bedTempC != null) {
    const t = checkNumber(c.bedTempC, -60, 100, 'bed temperature (°C)', trialId);
    if (t > HEATING_FLAG_C) mark('heating');
    if (t >= LETHAL_HEAT_C) mark('lethal-heat');
  }
  if (c.pH != null) {
    const p = checkNumber(c.pH, 0, 14, 'pH', trialId);
    if (p < ACIDITY_PH) mark('acidity');
    if (p > ALKALINITY_PH) mark('alkalinity');
  }
  if (c.smell === 'sour') mark('sour-smell');
  else if (c.smell === 'rotten') mark('rotten-smell');
  else if (c.smell === 'ammonia') mark('ammonia-smell');
  if (c.mould === true) mark('mould');
  if (c.moisture === 'waterlogged') mark('waterlogging');
  if (!Array.isArray(c.pests)) throw new RangeError(`trial ${trialId}: pests must be a list`);
  for (const p of c.pests) {
    if (p === 'springtails') continue;
    if (!ALL_PESTS.includes(p)) throw new RangeError(`trial ${trialId}: unknown pest ${String(p)}`);
    mark(p as AdverseEvent);
  }
}

function dayWord(d: number): string {
  return `day ${d}`;
}

/**
 * Classifies one trial from its check-ins (rules at the top of this file).
 * Returns the outcome (null while undecided), adverse events with the first
 * day each was seen, days to consumption (or censoring), and reasons in words.
 * Throws RangeError on bad dates, check-ins before the start, unknown codes or
 * out-of-range readings.
 */
export function classifyTrial(
  trial: Pick<TrialInput, 'id' | 'status' | 'startDate' | 'checkIns' | 'outcomeOverride'>,
): TrialClassification {
  const id = trial.id;
  if (trial.status !== 'running' && trial.status !== 'closed' && trial.status !== 'abandoned') {
    throw new RangeError(`trial ${id}: unknown status ${String(trial.status)}`);
  }
  const override = trial.outcomeOverride ?? null;
  if (override !== null) assertOutcome(override);
  const start = dayNumber(trial.startDate);
  const checkIns = trial.checkIns ?? [];
  if (!Array.isArray(checkIns)) throw new RangeError(`trial ${id}: checkIns must be a list`);

  const n = checkIns.length;
  const days = new Array<number>(n);
  const firstDay = new Array<number>(ADVERSE_EVENTS.length).fill(Infinity);
  let firstWormDay = Infinity;
  let lastDay = -Infinity;
  let springtails = false;
  let currentDay = 0;
  const mark = (e: AdverseEvent) => {
    const k = EVENT_INDEX[e];
    if (currentDay < firstDay[k]) firstDay[k] = currentDay;
  };
  for (let i = 0; i < n; i++) {
    const c = checkIns[i];
    const day = dayNumber(c.date) - start;
    if (day < 0) throw new RangeError(`trial ${id}: check-in ${c.date} is before the start ${trial.startDate}`);
    days[i] = day;
    currentDay = day;
    readCheckIn(c, id, mark);
    if (c.wormActivity !== 'none' && day < firstWormDay) firstWormDay = day;
    if (day > lastDay) lastDay = day;
    if (c.pests.includes('springtails')) springtails = true;
  }

  // First day the consumed threshold is met with worms seen by then (second pass: needs firstWormDay).
  let consumedDay = Infinity;
  let lastShare = Infinity;
  for (let i = 0; i < n; i++) {
    const s = checkIns[i].shareRemainingPct;
    if (s <= CONSUMED_MAX_REMAINING_PCT && days[i] >= firstWormDay && days[i] < consumedDay) consumedDay = days[i];
    if (days[i] === lastDay && s < lastShare) lastShare = s;
  }

  const adverseEvents: AdverseEventRecord[] = [];
  for (let k = 0; k < ADVERSE_EVENTS.length; k++) {
    if (firstDay[k] !== Infinity) adverseEvents.push({ event: ADVERSE_EVENTS[k], firstDay: firstDay[k] });
  }
  adverseEvents.sort((a, b) => a.firstDay - b.firstDay || EVENT_INDEX[a.event] - EVENT_INDEX[b.event]);

  const reasons: string[] = [];
  const deathsDay = firstDay[EVENT_INDEX['worm-deaths']];
  const exodusDay = firstDay[EVENT_INDEX.exodus];
  let fromCheckIns: Outcome | null = null;
  if (n === 0) {
    reasons.push('no check-ins yet');
  } else if (deathsDay !== Infinity || exodusDay !== Infinity) {
    fromCheckIns = 'harm';
    if (deathsDay !== Infinity) reasons.push(`worm deaths reported on ${dayWord(deathsDay)}`);
    if (exodusDay !== Infinity) reasons.push(`worms left the bed on ${dayWord(exodusDay)}`);
  } else if (consumedDay <= CONSUMPTION_WINDOW_DAYS) {
    fromCheckIns = 'consumed';
    reasons.push(
      `at most ${CONSUMED_MAX_REMAINING_PCT}% left with worms working it on ${dayWord(consumedDay)}, within the ${CONSUMPTION_WINDOW_DAYS}-day window`,
    );
  } else if (trial.status === 'closed') {
    if (firstWormDay === Infinity) {
      fromCheckIns = 'rejected';
      reasons.push('no worms seen in the feedstock at any check-in');
    } else {
      fromCheckIns = 'partial';
      if (consumedDay !== Infinity) {
        reasons.push(`consumed only on ${dayWord(consumedDay)}, after the ${CONSUMPTION_WINDOW_DAYS}-day window`);
      } else {
        reasons.push(`worms worked it from ${dayWord(firstWormDay)} but ${lastShare}% was left at the last check-in (${dayWord(lastDay)})`);
      }
    }
  } else {
    reasons.push(`${trial.status} with no decisive evidence yet (last check-in ${dayWord(lastDay)})`);
  }

  let outcome: Outcome | null = fromCheckIns;
  let outcomeSource: TrialClassification['outcomeSource'] = fromCheckIns === null ? null : 'check-ins';
  if (override !== null) {
    outcome = override;
    outcomeSource = 'owner';
    reasons.unshift(
      fromCheckIns === override || fromCheckIns === null
        ? `the owner confirmed the outcome: ${override}`
        : `the owner confirmed the outcome: ${override} (check-ins alone would give ${fromCheckIns})`,
    );
  }

  let daysToConsumption: number | null = consumedDay === Infinity ? null : consumedDay;
  if (daysToConsumption === null && override === 'consumed' && n > 0) {
    daysToConsumption = lastDay;
    reasons.push(`time to consumption taken as the last check-in (${dayWord(lastDay)}) on the owner's word`);
  }

  return {
    outcome,
    outcomeSource,
    adverseEvents,
    daysToConsumption,
    censored: daysToConsumption === null,
    followUpDays: n === 0 ? null : lastDay,
    harmless: springtails ? ['springtails'] : [],
    reasons,
  };
}
