/*
 * Reader-facing words for feedstock pages: preparations, outcomes, trial
 * statuses, published caution codes and handling cautions. Codes match the
 * database and the engine (PRODUCT.md vocabulary).
 */

import { PREPARATION_LABELS as PREPARATIONS, STATUS_LABELS, type Outcome } from '@/components/trial/vocabulary';

/** Preparation labels (one list: components/trial/vocabulary.ts), looked up by any stored code. */
export const PREPARATION_LABELS: Readonly<Record<string, string>> = PREPARATIONS;

export type OutcomeCode = Outcome;

/** Outcome labels on feedstock pages; "Rejected" here where trial pages say "Left alone". */
export const OUTCOME_LABELS: Readonly<Record<OutcomeCode, string>> = {
  consumed: 'Consumed',
  partial: 'Partly eaten',
  rejected: 'Rejected',
  harm: 'Harm',
};

/** Trial status labels (one list: components/trial/vocabulary.ts), looked up by any stored code. */
export const TRIAL_STATUS_LABELS: Readonly<Record<string, string>> = STATUS_LABELS;

/** Published caution codes: the engine's adverse events plus trade cautions it cannot read off check-ins. */
export const CAUTION_LABELS: Readonly<Record<string, string>> = {
  heating: 'Heats up as it breaks down',
  'lethal-heat': 'Can heat to a lethal level',
  mould: 'Mould',
  'sour-smell': 'Sours (sour smell)',
  'rotten-smell': 'Rotten smell',
  'ammonia-smell': 'Ammonia smell',
  acidity: 'Makes the bedding acidic',
  alkalinity: 'Makes the bedding alkaline',
  waterlogging: 'Waterlogs the bedding',
  exodus: 'Worms leave',
  'worm-deaths': 'Worm deaths',
  flatworms: 'Land flatworms (worm predators)',
  mites: 'Mites',
  'fruit-flies': 'Fruit flies',
  'fungus-gnats': 'Fungus gnats',
  ants: 'Ants',
  rodents: 'Draws rodents',
  'herbicide-carryover': 'Herbicide carry-over: castings can damage tomato-family crops and legumes',
  pathogens: 'Pathogens: a risk to people handling it',
  salt: 'Salt: harmful to worms above about 0.5%',
  microplastics: 'Plastic in the bag sheds microplastics',
  'slow-breakdown': 'Breaks down slowly',
  sprouting: 'Seeds or eyes may sprout',
};

/** The label for a caution code; unknown codes are shown as written, with hyphens as spaces. */
export function cautionLabel(code: string): string {
  return CAUTION_LABELS[code] ?? code.replace(/-/g, ' ');
}

export type HandlingCautionCode = 'manure' | 'mould' | 'dust' | 'shredder' | 'pathogens' | 'rodents';

/**
 * Handling advice for people, per handling caution (REFERENCES.md §7 and
 * TRADE.md §1, in our own words). Every list ends with the deferral to local
 * rules (components/layout/safety-note.tsx).
 */
export const HANDLING_ADVICE: Readonly<Record<HandlingCautionCode, { title: string; points: string[] }>> = {
  manure: {
    title: 'Manure',
    points: [
      'Wear gloves and wash your hands afterwards; keep cuts covered.',
      'Use manure from grazing animals only, aged past its hot stage. Never use dog, cat or human waste.',
      'Fresh manure can carry ammonia and salts that kill worms: age it, or rinse it through for several days first.',
    ],
  },
  pathogens: {
    title: 'Germs that can make people ill',
    points: [
      'A worm bin stays far cooler than the hot composting that kills pathogens, so it cannot be relied on to make unsafe material safe.',
      'Wash hands before eating, drinking or smoking, and keep children and pets away from fresh material.',
    ],
  },
  mould: {
    title: 'Mould',
    points: [
      'Mouldy material sheds spores when disturbed. Keep it damp, avoid shaking or turning it dry, and stand upwind.',
      'People with weakened immune systems or lung disease should let someone else handle it.',
    ],
  },
  dust: {
    title: 'Dust from compost, bedding and potting mix',
    points: [
      'Compost and potting-mix dust can carry Legionella longbeachae, caught by breathing dust or from hand to mouth.',
      'Dampen dry material first, wear a dust mask and gloves, and wash your hands; the germs stay on hands for up to an hour.',
    ],
  },
  shredder: {
    title: 'Shredders and mulchers',
    points: [
      'Wear safety glasses, hearing protection, gloves and close-fitting clothes; keep bystanders well back.',
      'Keep hands out of the chute. Stop the machine, wait for the blades to stop and disconnect power (or the spark plug) before clearing a jam.',
    ],
  },
  rodents: {
    title: 'Rodents and flies',
    points: ['Bury the material under bedding and keep beds covered.', 'Leave out meat, fat and cooked leftovers outdoors where rats can reach them.'],
  },
};
