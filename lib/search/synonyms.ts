/**
 * A small synonym map for feedstock search. Feedstock aliases (stored with
 * each feedstock) carry most other names; this table only folds the everyday
 * words people swap freely, so "banana skin", "melon rind" and "potato
 * peelings" all meet their pages. Both index text and queries go through it.
 * Keys are already singular (see normalise.ts).
 */

/** Multi-word phrases rewritten before words are split (matched on whole words). */
export const PHRASE_SYNONYMS: ReadonlyArray<readonly [string, string]> = [
  ['spring onion', 'onion'],
  ['spring onions', 'onion'],
  ['green onion', 'onion'],
  ['green onions', 'onion'],
  ['kitty litter', 'cat litter'],
  ['egg shell', 'eggshell'],
  ['egg shells', 'eggshell'],
  ['tea bag', 'teabag'],
  ['tea bags', 'teabag'],
  ['corn cob', 'corncob'],
  ['corn cobs', 'corncob'],
  ['wood chip', 'woodchip'],
  ['wood chips', 'woodchip'],
  ['saw dust', 'sawdust'],
  ['card board', 'cardboard'],
  ['news paper', 'newspaper'],
  ['sweet corn', 'sweetcorn'],
  ['sweet potato', 'potato'],
  ['sweet potatoes', 'potato'],
  ['hot pepper', 'chilli'],
  ['hot peppers', 'chilli'],
  ['chili pepper', 'chilli'],
  ['chilli pepper', 'chilli'],
  ['chilli peppers', 'chilli'],
  ['chili peppers', 'chilli'],
];

/** Single words mapped to the word the index uses. */
export const WORD_SYNONYMS: Readonly<Record<string, string>> = {
  // skins and peels
  skin: 'peel',
  rind: 'peel',
  peeling: 'peel',
  zest: 'peel',
  // citrus fruit all share one page family
  lime: 'citrus',
  grapefruit: 'citrus',
  tangerine: 'citrus',
  clementine: 'citrus',
  satsuma: 'citrus',
  // droppings
  poop: 'manure',
  poo: 'manure',
  dung: 'manure',
  droppings: 'manure',
  dropping: 'manure',
  muck: 'manure',
  faece: 'manure',
  faeces: 'manure',
  feces: 'manure',
  scat: 'manure',
  pat: 'manure',
  // spellings and regional names
  chili: 'chilli',
  chile: 'chilli',
  chilly: 'chilli', // "chillies" singularises to "chilly"
  jalapeno: 'chilli',
  cayenne: 'chilli',
  zucchini: 'courgette',
  mold: 'mould',
  moldy: 'mouldy',
  spud: 'potato',
  tater: 'potato',
  oatmeal: 'oat',
  cutting: 'clipping',
  mowing: 'clipping',
  stalk: 'stem',
};
