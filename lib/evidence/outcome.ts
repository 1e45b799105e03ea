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

const EVENT_INDEX: Record<AdverseEvent, number> = Object.fromEntries(
  ADVERSE_EVENTS.map((e, i) => [e, i]),
) as Record<AdverseEvent, number>;

const OUTCOMES: readonly Outcome[] = ['consumed', 'partial', 'rejected', 'harm'];


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

const dayNum = dayNumber;

// Local copies of the thresholds: read in the hot loop without going through module bindings.
const HEAT_C = HEATING_FLAG_C;
const LETHAL_C = LETHAL_HEAT_C;
const ACID_PH = ACIDITY_PH;
const ALKALI_PH = ALKALINITY_PH;
const CONSUMED_PCT = CONSUMED_MAX_REMAINING_PCT;
const WINDOW_DAYS = CONSUMPTION_WINDOW_DAYS;

const I_DEATHS = EVENT_INDEX['worm-deaths'];
const I_EXODUS = EVENT_INDEX.exodus;
const I_LETHAL = EVENT_INDEX['lethal-heat'];
const I_HEATING = EVENT_INDEX.heating;
const I_ACID = EVENT_INDEX.acidity;
const I_ALKALI = EVENT_INDEX.alkalinity;
const I_SOUR = EVENT_INDEX['sour-smell'];
const I_ROTTEN = EVENT_INDEX['rotten-smell'];
const I_AMMONIA = EVENT_INDEX['ammonia-smell'];
const I_MOULD = EVENT_INDEX.mould;
const I_WATER = EVENT_INDEX.waterlogging;

function bad(trialId: string, what: string, value: unknown): never {
  throw new RangeError(`trial ${trialId}: ${what}, got ${String(value)}`);
}

function isNumberIn(x: unknown, lo: number, hi: number): x is number {
  return typeof x === 'number' && x >= lo && x <= hi; // NaN fails both comparisons
}

/** Validates one outcome code; throws RangeError on anything else. */
export function assertOutcome(x: unknown): Outcome {
  if (!OUTCOMES.includes(x as Outcome)) throw new RangeError(`unknown outcome: ${String(x)}`);
  return x as Outcome;
}

/**
 * Reads one check-in: validates it and lowers firstDay[k] to `day` for each
 * adverse event k it shows. Returns true when springtails were seen.
 */
function readCheckIn(c: CheckIn, trialId: string, firstDay: number[], day: number): boolean {
  switch (c.wormActivity) {
    case 'none':
    case 'few':
    case 'many':
    case 'swarming':
      break;
    default:
      bad(trialId, 'unknown worm activity', c.wormActivity);
  }
  if (!isNumberIn(c.shareRemainingPct, 0, 100)) bad(trialId, 'share remaining must be 0..100 %', c.shareRemainingPct);
  if (c.wormDeaths === true && day < firstDay[I_DEATHS]) firstDay[I_DEATHS] = day;
  if (c.exodus === true && day < firstDay[I_EXODUS]) firstDay[I_EXODUS] = day;
  const t = c.bedTempC;
  if (t != null) {
    if (!isNumberIn(t, -60, 100)) bad(trialId, 'bed temperature must be -60..100 °C', t);
    if (t > HEAT_C && day < firstDay[I_HEATING]) firstDay[I_HEATING] = day;
    if (t >= LETHAL_C && day < firstDay[I_LETHAL]) firstDay[I_LETHAL] = day;
  }
  const p = c.pH;
  if (p != null) {
    if (!isNumberIn(p, 0, 14)) bad(trialId, 'pH must be 0..14', p);
    if (p < ACID_PH && day < firstDay[I_ACID]) firstDay[I_ACID] = day;
    if (p > ALKALI_PH && day < firstDay[I_ALKALI]) firstDay[I_ALKALI] = day;
  }
  switch (c.smell) {
    case 'none':
    case 'earthy':
      break;
    case 'sour':
      if (day < firstDay[I_SOUR]) firstDay[I_SOUR] = day;
      break;
    case 'rotten':
      if (day < firstDay[I_ROTTEN]) firstDay[I_ROTTEN] = day;
      break;
    case 'ammonia':
      if (day < firstDay[I_AMMONIA]) firstDay[I_AMMONIA] = day;
      break;
    default:
      bad(trialId, 'unknown smell', c.smell);
  }
  if (c.mould === true && day < firstDay[I_MOULD]) firstDay[I_MOULD] = day;
  switch (c.moisture) {
    case 'dry':
    case 'damp':
    case 'wet':
      break;
    case 'waterlogged':
      if (day < firstDay[I_WATER]) firstDay[I_WATER] = day;
      break;
    default:
      bad(trialId, 'unknown moisture', c.moisture);
  }
  const pests = c.pests;
  if (!Array.isArray(pests)) bad(trialId, 'pests must be a list', pests);
  let springtails = false;
  for (let i = 0; i < pests.length; i++) {
    const pest = pests[i];
    switch (pest) {
      case 'springtails':
        springtails = true;
        break;
      case 'flatworms':
      case 'mites':
      case 'fruit-flies':
      case 'fungus-gnats':
      case 'ants':
      case 'rodents': {
        const k = EVENT_INDEX[pest];
        if (day < firstDay[k]) firstDay[k] = day;
        break;
      }
      default:
        bad(trialId, 'unknown pest', pest);
    }
  }
  return springtails;
}

/**
 * Adverse events a single check-in shows (no days). Useful for the check-in
 * screen. Throws RangeError on out-of-range readings or unknown codes.
 */
export function checkInEvents(c: CheckIn, trialId = '?'): AdverseEvent[] {
  const firstDay = new Array<number>(ADVERSE_EVENTS.length).fill(Infinity);
  readCheckIn(c, trialId, firstDay, 0);
  return ADVERSE_EVENTS.filter((_, i) => firstDay[i] === 0);
}

function byDayThenEvent(a: AdverseEventRecord, b: AdverseEventRecord): number {
  return a.firstDay - b.firstDay || EVENT_INDEX[a.event] - EVENT_INDEX[b.event];
}

function dayWord(d: number): string {
  return `day ${d}`;
}

/** What the rules read off a trial's check-ins (before words). */
interface Reading {
  n: number;
  firstWormDay: number;
  lastDay: number;
  lastShare: number;
  consumedDay: number;
  springtails: boolean;
  /** Bit k set when ADVERSE_EVENTS[k] was seen. */
  eventMask: number;
}

/** Scratch for first days per event; reset on every call. */
const FIRST_DAY = new Array<number>(ADVERSE_EVENTS.length).fill(Infinity);

/** Scratch reading, overwritten by every readTrial call (the engine is synchronous; callers copy what they keep). */
const READING: Reading = { n: 0, firstWormDay: Infinity, lastDay: -Infinity, lastShare: Infinity, consumedDay: Infinity, springtails: false, eventMask: 0 };

/** Reads all check-ins (validating them) into FIRST_DAY and the shared READING, which it returns. */
function readTrial(trial: Pick<TrialInput, 'id' | 'status' | 'startDate' | 'checkIns' | 'outcomeOverride'>): Reading {
  const id = trial.id;
  if (trial.status !== 'running' && trial.status !== 'closed' && trial.status !== 'abandoned') {
    throw new RangeError(`trial ${id}: unknown status ${String(trial.status)}`);
  }
  const override = trial.outcomeOverride ?? null;
  if (override !== null) assertOutcome(override);
  const start = dayNum(trial.startDate);
  const checkIns = trial.checkIns ?? [];
  if (!Array.isArray(checkIns)) throw new RangeError(`trial ${id}: checkIns must be a list`);
  const firstDay = FIRST_DAY;
  firstDay.fill(Infinity);
  const n = checkIns.length;
  let firstWormDay = Infinity;
  let lastDay = -Infinity;
  let lastShare = Infinity;
  let springtails = false;
  // Earliest day with at most CONSUMED_PCT % left; it counts only once worms have been seen (checked below).
  let lowShareDay = Infinity;
  for (let i = 0; i < n; i++) {
    const c = checkIns[i];
    const day = dayNum(c.date) - start;
    if (day < 0) throw new RangeError(`trial ${id}: check-in ${c.date} is before the start ${trial.startDate}`);
    if (readCheckIn(c, id, firstDay, day)) springtails = true;
    if (c.wormActivity !== 'none' && day < firstWormDay) firstWormDay = day;
    const s = c.shareRemainingPct;
    if (day > lastDay) {
      lastDay = day;
      lastShare = s;
    } else if (day === lastDay && s < lastShare) lastShare = s;
    if (s <= CONSUMED_PCT && day < lowShareDay) lowShareDay = day;
  }
  // First day the consumed threshold is met with worms seen by then. When the earliest low-share day
  // came before the worms, look again for the earliest low-share day on or after their first day.
  let consumedDay = Infinity;
  if (lowShareDay !== Infinity && firstWormDay !== Infinity) {
    if (lowShareDay >= firstWormDay) consumedDay = lowShareDay;
    else {
      for (let i = 0; i < n; i++) {
        const c = checkIns[i];
        if (c.shareRemainingPct > CONSUMED_PCT) continue;
        const day = dayNum(c.date) - start;
        if (day >= firstWormDay && day < consumedDay) consumedDay = day;
      }
    }
  }
  let eventMask = 0;
  for (let k = 0; k < firstDay.length; k++) if (firstDay[k] !== Infinity) eventMask |= 1 << k;
  const r = READING;
  r.n = n;
  r.firstWormDay = firstWormDay;
  r.lastDay = lastDay;
  r.lastShare = lastShare;
  r.consumedDay = consumedDay;
  r.springtails = springtails;
  r.eventMask = eventMask;
  return r;
}

/** The outcome the check-ins alone give (rules 2–5 at the top of this file). */
function outcomeFromReading(r: Reading, status: TrialInput['status']): Outcome | null {
  if (r.n === 0) return null;
  if (r.eventMask & ((1 << I_DEATHS) | (1 << I_EXODUS))) return 'harm';
  if (r.consumedDay <= WINDOW_DAYS) return 'consumed';
  if (status === 'closed') return r.firstWormDay === Infinity ? 'rejected' : 'partial';
  return null;
}

/** Days to consumption: observed, or the last check-in when the owner confirmed consumption. */
function consumptionDays(r: Reading, override: Outcome | null): number | null {
  if (r.consumedDay !== Infinity) return r.consumedDay;
  if (override === 'consumed' && r.n > 0) return r.lastDay;
  return null;
}

/** Compact classification used by aggregation (same rules as classifyTrial, no words). */
export interface TrialSummary {
  outcome: Outcome | null;
  eventMask: number;
  daysToConsumption: number | null;
  followUpDays: number | null;
  springtails: boolean;
}

/**
 * The same classification as classifyTrial without the words and event
 * records (aggregation hot path). Throws like classifyTrial.
 */
export function summariseTrial(trial: Pick<TrialInput, 'id' | 'status' | 'startDate' | 'checkIns' | 'outcomeOverride'>): TrialSummary {
  return summariseTrialInto(trial, { outcome: null, eventMask: 0, daysToConsumption: null, followUpDays: null, springtails: false });
}

/**
 * As summariseTrial, writing the summary fields into `target` (which it
 * returns) instead of a new object. Throws like classifyTrial.
 */
export function summariseTrialInto<T extends TrialSummary>(
  trial: Pick<TrialInput, 'id' | 'status' | 'startDate' | 'checkIns' | 'outcomeOverride'>,
  target: T,
): T {
  const r = readTrial(trial);
  const override = trial.outcomeOverride ?? null;
  target.outcome = override ?? outcomeFromReading(r, trial.status);
  target.eventMask = r.eventMask;
  target.daysToConsumption = consumptionDays(r, override);
  target.followUpDays = r.n === 0 ? null : r.lastDay;
  target.springtails = r.springtails;
  return target;
}

/** Adverse events in an event mask, in ADVERSE_EVENTS order. Throws nothing. */
export function eventsInMask(mask: number): AdverseEvent[] {
  const out: AdverseEvent[] = [];
  for (let k = 0; k < ADVERSE_EVENTS.length; k++) if (mask & (1 << k)) out.push(ADVERSE_EVENTS[k]);
  return out;
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
  const r = readTrial(trial);
  const firstDay = FIRST_DAY;
  const override = trial.outcomeOverride ?? null;
  const fromCheckIns = outcomeFromReading(r, trial.status);

  const adverseEvents: AdverseEventRecord[] = [];
  for (let k = 0; k < ADVERSE_EVENTS.length; k++) {
    if (firstDay[k] !== Infinity) adverseEvents.push({ event: ADVERSE_EVENTS[k], firstDay: firstDay[k] });
  }
  adverseEvents.sort(byDayThenEvent);

  const reasons: string[] = [];
  const deathsDay = firstDay[I_DEATHS];
  const exodusDay = firstDay[I_EXODUS];
  if (r.n === 0) reasons.push('no check-ins yet');
  else if (fromCheckIns === 'harm') {
    if (deathsDay !== Infinity) reasons.push(`worm deaths reported on ${dayWord(deathsDay)}`);
    if (exodusDay !== Infinity) reasons.push(`worms left the bed on ${dayWord(exodusDay)}`);
  } else if (fromCheckIns === 'consumed') {
    reasons.push(
      `at most ${CONSUMED_MAX_REMAINING_PCT}% left with worms working it on ${dayWord(r.consumedDay)}, within the ${CONSUMPTION_WINDOW_DAYS}-day window`,
    );
  } else if (fromCheckIns === 'rejected') {
    reasons.push('no worms seen in the feedstock at any check-in');
  } else if (fromCheckIns === 'partial') {
    reasons.push(
      r.consumedDay !== Infinity
        ? `consumed only on ${dayWord(r.consumedDay)}, after the ${CONSUMPTION_WINDOW_DAYS}-day window`
        : `worms worked it from ${dayWord(r.firstWormDay)} but ${r.lastShare}% was left at the last check-in (${dayWord(r.lastDay)})`,
    );
  } else {
    reasons.push(`${trial.status} with no decisive evidence yet (last check-in ${dayWord(r.lastDay)})`);
  }
  if (override !== null) {
    reasons.unshift(
      fromCheckIns === override || fromCheckIns === null
        ? `the owner confirmed the outcome: ${override}`
        : `the owner confirmed the outcome: ${override} (check-ins alone would give ${fromCheckIns})`,
    );
  }
  const daysToConsumption = consumptionDays(r, override);
  if (r.consumedDay === Infinity && daysToConsumption !== null) {
    reasons.push(`time to consumption taken as the last check-in (${dayWord(r.lastDay)}) on the owner's word`);
  }
  return {
    outcome: override ?? fromCheckIns,
    outcomeSource: override !== null ? 'owner' : fromCheckIns === null ? null : 'check-ins',
    adverseEvents,
    daysToConsumption,
    censored: daysToConsumption === null,
    followUpDays: r.n === 0 ? null : r.lastDay,
    harmless: r.springtails ? ['springtails'] : [],
    reasons,
  };
}
