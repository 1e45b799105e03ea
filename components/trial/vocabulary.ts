/*
 * Reader-facing words for trials and check-ins (PRODUCT.md vocabulary). Codes
 * match lib/validation/trials.ts and the database; this file only holds labels.
 * Safe in client components.
 */

export const OUTCOMES = ['consumed', 'partial', 'rejected', 'harm'] as const;
export type Outcome = (typeof OUTCOMES)[number];
export type TrialStatus = 'running' | 'closed' | 'abandoned';

export const PREPARATION_LABELS = {
  raw: 'Raw',
  chopped: 'Chopped',
  shredded: 'Shredded or mulched',
  'frozen-thawed': 'Frozen and thawed',
  cooked: 'Cooked',
  soaked: 'Soaked',
  dried: 'Dried',
  'pre-composted': 'Pre-composted',
  aged: 'Aged',
} as const;

export const PROVENANCE_LABELS = {
  'home-grown': 'Home-grown',
  'store-bought': 'Store-bought',
  'commercial-scrap': 'Commercial scrap (café, shop, market)',
} as const;

export const SPECIES_LABELS = {
  'eisenia-fetida': 'Eisenia fetida (red wiggler)',
  'eisenia-andrei': 'Eisenia andrei',
  'perionyx-excavatus': 'Perionyx excavatus',
  'eudrilus-eugeniae': 'Eudrilus eugeniae',
  'mixed-unknown': 'Mixed or not sure',
} as const;

export const OUTCOME_LABELS: Readonly<Record<Outcome, string>> = {
  consumed: 'Consumed',
  partial: 'Partly eaten',
  rejected: 'Left alone',
  harm: 'Harm',
};

export const OUTCOME_DESCRIPTIONS: Readonly<Record<Outcome, string>> = {
  consumed: 'Little left, with worms working it, within four weeks.',
  partial: 'Worms worked it, but a good share was left or it took longer than four weeks.',
  rejected: 'The worms stayed away from it to the end.',
  harm: 'Worm deaths or worms leaving the bed.',
};

export const STATUS_LABELS: Readonly<Record<TrialStatus, string>> = {
  running: 'Running',
  closed: 'Closed',
  abandoned: 'Abandoned',
};

export const ACTIVITY_LEVELS = ['none', 'few', 'many', 'swarming'] as const;
export type WormActivity = (typeof ACTIVITY_LEVELS)[number];
export const ACTIVITY_LABELS: Readonly<Record<WormActivity, string>> = {
  none: 'None',
  few: 'A few',
  many: 'Many',
  swarming: 'Swarming',
};

export const SMELL_LABELS = {
  none: 'No smell',
  earthy: 'Earthy',
  sour: 'Sour',
  rotten: 'Rotten',
  ammonia: 'Ammonia',
} as const;

export const MOISTURE_LABELS = {
  dry: 'Dry',
  damp: 'Damp (like a wrung-out sponge)',
  wet: 'Wet',
  waterlogged: 'Waterlogged',
} as const;

export const PEST_LABELS = {
  'land-flatworms': 'Land flatworms',
  mites: 'Mites',
  'fruit-flies': 'Fruit flies',
  'fungus-gnats': 'Fungus gnats',
  ants: 'Ants',
  rodents: 'Rodents',
  springtails: 'Springtails (harmless)',
} as const;

export const AREA_UNIT_LABELS = { m2: 'm²', ft2: 'ft²' } as const;
export const LENGTH_UNIT_LABELS = { cm: 'cm', in: 'in' } as const;
export const MASS_UNIT_LABELS = { kg: 'kg', g: 'g', lb: 'lb', oz: 'oz' } as const;
export const VOLUME_UNIT_LABELS = { L: 'litres', mL: 'millilitres', gal: 'US gallons', qt: 'US quarts', m3: 'm³', yd3: 'yd³', ft3: 'ft³' } as const;

/** A dose as written by the keeper, e.g. "1.5 kg" or "2 US gallons". */
export function formatDose(amount: number, unit: string): string {
  const label = (MASS_UNIT_LABELS as Record<string, string>)[unit] ?? (VOLUME_UNIT_LABELS as Record<string, string>)[unit] ?? unit;
  return `${formatNumber(amount)} ${label}`;
}

/** A number with at most `digits` decimals and no trailing zeros. */
export function formatNumber(x: number, digits = 2): string {
  return new Intl.NumberFormat('en-GB', { maximumFractionDigits: digits }).format(x);
}

/** A calendar date `YYYY-MM-DD` as "3 Oct 2026" (the same on every server). */
export function formatDay(date: string): string {
  const d = new Date(`${date}T00:00:00Z`);
  if (Number.isNaN(d.getTime())) return date;
  return new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'UTC' }).format(d);
}
