/**
 * Reader-facing words for stored codes that lib/ needs too (search, feeds,
 * mail, the engine's sentences). Plain data, safe in client components; the
 * components' vocabulary files re-export what pages use from here.
 */

/** Feedstock categories, as stored. */
export const CATEGORIES = ['fruit', 'vegetable', 'grain-starch', 'paper-card', 'garden', 'manure', 'animal-product', 'other'] as const;
export type Category = (typeof CATEGORIES)[number];

export const CATEGORY_LABELS: Readonly<Record<Category, string>> = {
  fruit: 'Fruit',
  vegetable: 'Vegetable',
  'grain-starch': 'Grain and starch',
  'paper-card': 'Paper and card',
  garden: 'Garden',
  manure: 'Manure',
  'animal-product': 'Animal product',
  other: 'Other',
};

/** Verdict codes, in the order pages list them (PRODUCT.md, core vocabulary). */
export const VERDICTS = ['feed', 'limit', 'prepare', 'avoid', 'unsettled'] as const;
export type Verdict = (typeof VERDICTS)[number];

/** The label of each verdict — the words readers see everywhere (pages, feeds, mail, engine sentences). */
export const VERDICT_LABELS: Readonly<Record<Verdict, string>> = {
  feed: 'Feed freely',
  limit: 'Small amounts only',
  prepare: 'Prepare first',
  avoid: 'Keep out',
  unsettled: 'Not enough evidence',
};

/** Setting codes, as stored. */
type SettingCode = 'bin' | 'flow-through' | 'bed';

/** Settings in the plural, for "Keep out in enclosed bins". */
export const SETTING_PLURALS: Readonly<Record<SettingCode, string>> = {
  bin: 'enclosed bins',
  'flow-through': 'flow-through systems',
  bed: 'open beds',
};

/** One setting with its article, for "a trial in an enclosed bin". */
export const SETTING_PHRASES: Readonly<Record<SettingCode, string>> = {
  bin: 'an enclosed bin',
  'flow-through': 'a flow-through system',
  bed: 'an open bed',
};
