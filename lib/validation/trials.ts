import { z } from 'zod';

/** Shared zod schemas for trials and check-ins: the same ones in the browser form and on the server. */

export const SETTINGS = ['bin', 'flow-through', 'bed'] as const;
export const PREPARATIONS = ['raw', 'chopped', 'shredded', 'frozen-thawed', 'cooked', 'soaked', 'dried', 'pre-composted', 'aged'] as const;
export const PROVENANCES = ['home-grown', 'store-bought', 'commercial-scrap'] as const;
export const SPECIES = ['eisenia-fetida', 'eisenia-andrei', 'perionyx-excavatus', 'eudrilus-eugeniae', 'mixed-unknown'] as const;
export const OUTCOMES = ['consumed', 'partial', 'rejected', 'harm'] as const;
export const MASS_UNITS = ['kg', 'g', 'lb', 'oz'] as const;
export const VOLUME_UNITS = ['L', 'mL', 'gal', 'qt', 'm3', 'yd3', 'ft3'] as const;
export const PESTS = ['land-flatworms', 'mites', 'fruit-flies', 'fungus-gnats', 'ants', 'rodents', 'springtails'] as const;

const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-05-31.')
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), 'Not a real date.');

/** A calendar date no later than tomorrow (UTC), so keepers east of Greenwich can log today. */
const pastOrToday = isoDate.refine((s) => s <= new Date(Date.now() + 86_400_000).toISOString().slice(0, 10), 'That date is in the future.');

const positive = (what: string) => z.coerce.number({ message: `${what} must be a number.` }).finite().positive(`${what} must be more than zero.`);

export const TrialCreateSchema = z.object({
  feedstockId: z.coerce.number({ message: 'Choose a feedstock.' }).int().positive('Choose a feedstock.'),
  setting: z.enum(SETTINGS, { message: 'Choose a setting.' }),
  preparation: z.enum(PREPARATIONS, { message: 'Choose a preparation.' }),
  provenance: z.enum(PROVENANCES, { message: 'Choose where it came from.' }),
  surfaceArea: z.object({ amount: positive('Surface area').max(10_000, 'That is larger than any bed we know.'), unit: z.enum(['m2', 'ft2']) }),
  bedDepth: z.object({ amount: positive('Bed depth').max(500), unit: z.enum(['cm', 'in']) }).nullish(),
  species: z.enum(SPECIES, { message: 'Choose a worm species (or "mixed / not sure").' }),
  wormMass: z.object({ amount: positive('Worm mass').max(10_000), unit: z.enum(MASS_UNITS) }).nullish(),
  dose: z.object({
    amount: positive('Dose').max(100_000, 'That dose is beyond any bed.'),
    unit: z.enum([...MASS_UNITS, ...VOLUME_UNITS], { message: 'Choose a unit.' }),
  }),
  layerDepth: z.object({ amount: positive('Layer depth').max(300), unit: z.enum(['cm', 'in']) }).nullish(),
  pairedTrialId: z.coerce.number().int().positive().nullish(),
  isControl: z.coerce.boolean().default(false),
  region: z.string().trim().min(2, 'Name a region (a town or county, never an address).').max(80),
  startDate: pastOrToday,
  checkInEveryDays: z.coerce.number().int().min(1, 'At least every day.').max(60, 'At most every 60 days.').default(7),
  notes: z.string().max(5_000).default(''),
});
export type TrialCreateInput = z.infer<typeof TrialCreateSchema>;

export const CheckInCreateSchema = z.object({
  observedOn: pastOrToday,
  utcOffsetMinutes: z.coerce.number().int().min(-840).max(840).default(0),
  wormActivity: z.enum(['none', 'few', 'many', 'swarming'], { message: 'How many worms were in the feed?' }),
  shareRemainingPct: z.coerce
    .number({ message: 'Share remaining must be a number.' })
    .min(0, 'Share remaining cannot be below 0%.')
    .max(100, 'Share remaining cannot be above 100%.'),
  bedTemp: z.object({ value: z.coerce.number().min(-40).max(90), unit: z.enum(['C', 'F']) }).nullish(),
  mould: z.coerce.boolean().default(false),
  smell: z.enum(['none', 'earthy', 'sour', 'rotten', 'ammonia']).default('none'),
  moisture: z.enum(['dry', 'damp', 'wet', 'waterlogged']).default('damp'),
  ph: z.coerce.number().min(0, 'pH runs from 0 to 14.').max(14, 'pH runs from 0 to 14.').nullish(),
  pests: z.array(z.enum(PESTS)).max(PESTS.length).default([]).transform((p) => [...new Set(p)]),
  wormDeaths: z.coerce.boolean().default(false),
  exodus: z.coerce.boolean().default(false),
  notes: z.string().max(5_000).default(''),
});
export type CheckInCreateInput = z.infer<typeof CheckInCreateSchema>;

export const TrialCloseSchema = z.object({
  status: z.enum(['closed', 'abandoned']).default('closed'),
  outcome: z.enum(OUTCOMES).nullish(),
  reason: z.string().trim().max(2_000).default(''),
});
export type TrialCloseInput = z.infer<typeof TrialCloseSchema>;
