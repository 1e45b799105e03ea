/**
 * Cautions: for each adverse event, how many trials showed it and at which
 * surface loads ("heating in 3 of 5 trials, all above 6 kg/m²").
 */
import { formatLoad } from './units';
import { ADVERSE_EVENTS, ADVERSE_EVENT_WORDS } from './outcome';
import type { AdverseEvent, Caution } from './types';

/** A trial as the caution list sees it. */
export interface CautionTrial {
  id: string;
  loadKgM2: number;
  /** Events seen: either as records... */
  adverseEvents?: readonly { event: AdverseEvent }[];
  /** ...or as a bit mask, bit k = ADVERSE_EVENTS[k] (wins when given). */
  eventMask?: number;
  /** Trials without check-ins are left out of the denominator. */
  hasCheckIns: boolean;
}

const INDEX: Record<string, number> = Object.fromEntries(ADVERSE_EVENTS.map((e, i) => [e, i]));
const INDEX_MAP = new Map<string, number>(ADVERSE_EVENTS.map((e, i) => [e, i]));

/**
 * Caution list of a group, most frequent first (ties in the fixed event order
 * of ADVERSE_EVENTS). Denominator: trials with at least one check-in.
 * Load pattern: `above` when every trial with the event had a higher load than
 * every trial without it (boundary = highest load without it); `all-loads`
 * when every trial had it; else `mixed` (the load range is given).
 * Trials without check-ins are ignored. Throws RangeError on an unknown event.
 */
export function computeCautions(trials: readonly CautionTrial[]): Caution[] {
  const k = ADVERSE_EVENTS.length;
  const count = new Array<number>(k).fill(0);
  const minWith = new Array<number>(k).fill(Infinity);
  const maxWith = new Array<number>(k).fill(-Infinity);
  const maxWithout = new Array<number>(k).fill(-Infinity);
  const ids: string[][] = Array.from({ length: k }, () => []);
  let outOf = 0;
  let maxWithoutAny = -Infinity;
  for (let ti = 0; ti < trials.length; ti++) {
    const t = trials[ti];
    if (!t.hasCheckIns) continue;
    outOf++;
    let mask = t.eventMask ?? 0;
    if (t.eventMask === undefined && t.adverseEvents) {
      const evs = t.adverseEvents;
      for (let j = 0; j < evs.length; j++) {
        const bit = INDEX_MAP.get(evs[j].event);
        if (bit === undefined) throw new RangeError(`unknown adverse event ${String(evs[j].event)}`);
        mask |= 1 << bit;
      }
    }
    const x = t.loadKgM2;
    if (mask === 0) {
      // no events: only "highest load without the event" changes, for every event alike
      if (x > maxWithoutAny) maxWithoutAny = x;
      continue;
    }
    for (let i = 0; i < k; i++) {
      if (mask & (1 << i)) {
        count[i]++;
        if (x < minWith[i]) minWith[i] = x;
        if (x > maxWith[i]) maxWith[i] = x;
        ids[i].push(t.id);
      } else if (x > maxWithout[i]) maxWithout[i] = x;
    }
  }
  for (let i = 0; i < k; i++) if (maxWithoutAny > maxWithout[i]) maxWithout[i] = maxWithoutAny;
  const out: Caution[] = [];
  for (let i = 0; i < k; i++) {
    if (count[i] === 0) continue;
    const event = ADVERSE_EVENTS[i];
    let pattern: Caution['pattern'];
    let boundary: number | null = null;
    if (count[i] === outOf) pattern = 'all-loads';
    else if (minWith[i] > maxWithout[i]) {
      pattern = 'above';
      boundary = maxWithout[i];
    } else pattern = 'mixed';
    const range =
      minWith[i] === maxWith[i] ? `${formatLoad(minWith[i])} kg/m²` : `${formatLoad(minWith[i])}–${formatLoad(maxWith[i])} kg/m²`;
    const where =
      pattern === 'above'
        ? `all above ${formatLoad(boundary as number)} kg/m²`
        : pattern === 'all-loads'
          ? `at every tested load (${range})`
          : `at ${range}`;
    const words = ADVERSE_EVENT_WORDS[event];
    out.push({
      event,
      trials: count[i],
      outOf,
      minLoadKgM2: minWith[i],
      maxLoadKgM2: maxWith[i],
      pattern,
      boundaryKgM2: boundary,
      trialIds: ids[i].slice().sort((a, b) => (a < b ? -1 : a > b ? 1 : 0)),
      text: `${words[0].toUpperCase()}${words.slice(1)} in ${count[i]} of ${outOf} trials, ${where}`,
    });
  }
  out.sort((a, b) => b.trials - a.trials || INDEX[a.event] - INDEX[b.event]);
  return out;
}
