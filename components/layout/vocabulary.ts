import type { CertaintyGrade, Verdict } from '@/components/evidence/verdict-badge';

/*
 * Reader-facing wording for the shared vocabulary (PRODUCT.md). Codes match
 * the engine's; this file only holds the sentences pages show.
 */

/** Settings a verdict is given for. */
export const SETTINGS = ['bin', 'flow-through', 'bed'] as const;
export type Setting = (typeof SETTINGS)[number];

export const SETTING_LABELS: Readonly<Record<Setting, string>> = {
  bin: 'Enclosed bin',
  'flow-through': 'Flow-through system',
  bed: 'Open bed',
};

export const SETTING_DESCRIPTIONS: Readonly<Record<Setting, string>> = {
  bin: 'A closed bin, tray stack or tub. Worms cannot get away from a bad patch, so doses matter most here.',
  'flow-through':
    'A continuous flow-through system: food goes on top, finished castings come out through a mesh floor.',
  bed: 'An open bed, in-ground trench or windrow. Worms can move away from trouble and come back when it has passed.',
};

export const VERDICT_DESCRIPTIONS: Readonly<Record<Verdict, string>> = {
  feed: 'Taken readily at ordinary doses.',
  limit: 'Fine below a dose ceiling; above it, expect heat, sourness, mould or pests.',
  prepare: 'Fine only after a preparation step — pre-composting, soaking, chopping or ageing.',
  avoid: 'Harms the worms, the bin or the people tending it at practical doses.',
  unsettled: 'Too few independent trials to say yet. A logged trial helps.',
};

export const CERTAINTY_DESCRIPTIONS: Readonly<Record<CertaintyGrade, string>> = {
  high: 'Many independent trials agree; more evidence is unlikely to change the verdict.',
  moderate: 'The verdict is probably right, but more trials could shift the details.',
  low: 'The verdict may well change as trials come in.',
  'very low': 'A first indication only — treat it as a guess backed by a little evidence.',
};


export { CATEGORIES, CATEGORY_LABELS, type Category } from '@/lib/vocabulary';
