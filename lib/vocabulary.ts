/** Reader-facing words for stored codes that lib/ needs too (search, feeds). */
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
