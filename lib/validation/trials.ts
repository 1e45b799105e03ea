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

/** The trial fields a keeper enters, without defaults (shared by create and update). */
const trialFields = {
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
  isControl: z.coerce.boolean(),
  region: z.string().trim().min(2, 'Name a region (a town or county, never an address).').max(80),
  startDate: pastOrToday,
  checkInEveryDays: z.coerce.number().int().min(1, 'At least every day.').max(60, 'At most every 60 days.'),
  notes: z.string().max(5_000),
};

export const TrialCreateSchema = z.object({
  feedstockId: z.coerce.number({ message: 'Choose a feedstock.' }).int().positive('Choose a feedstock.'),
  ...trialFields,
  isControl: trialFields.isControl.default(false),
  checkInEveryDays: trialFields.checkInEveryDays.default(7),
  notes: trialFields.notes.default(''),
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

/**
 * A change to a trial's details by its owner (or a moderator): any subset of
 * the fields a keeper entered, plus the version the editor saw (a stale
 * version is a conflict). The feedstock of a trial never changes.
 */
export const TrialUpdateSchema = z
  .object(trialFields)
  .partial()
  .extend({ version: z.coerce.number({ message: 'Reload the trial and try again.' }).int().positive() });
export type TrialUpdateInput = z.infer<typeof TrialUpdateSchema>;

/** Query of a photo upload (the body is the image itself). */
export const PhotoUploadQuerySchema = z.object({
  checkInId: z.coerce.number().int().positive().nullish(),
  caption: z.string().trim().max(300, 'Keep the caption under 300 characters.').default(''),
});
export type PhotoUploadQuery = z.infer<typeof PhotoUploadQuerySchema>;

export const TRIAL_STATUSES = ['running', 'closed', 'abandoned'] as const;

/** Filters of the trial list (page and JSON API); bad values are dropped, not errors. */
export const TrialListQuerySchema = z.object({
  feedstock: z.string().trim().regex(/^[a-z0-9-]{1,120}$/).optional().catch(undefined),
  setting: z.enum(SETTINGS).optional().catch(undefined),
  status: z.enum(TRIAL_STATUSES).optional().catch(undefined),
  contributor: z.string().trim().regex(/^[0-9a-f]{10}$/).optional().catch(undefined),
  page: z.coerce.number().int().min(1).max(10_000).catch(1).default(1),
});
export type TrialListQuery = z.infer<typeof TrialListQuerySchema>;

/** Query of the export routes: file format and which table. */
export const ExportQuerySchema = z.object({
  format: z.enum(['csv', 'json'], { message: 'format is csv or json.' }).default('json'),
  table: z.enum(['trials', 'check-ins'], { message: 'table is trials or check-ins.' }).default('trials'),
});
export type ExportQuery = z.infer<typeof ExportQuerySchema>;

// ---------------------------------------------------------------- forms
// Forms post flat fields named by the schema's dotted paths ("dose.amount"), so
// a field error from zod ("dose.amount") lands next to the input of that name.

/** What a form posts: FormData in the browser and in a server action. */
export interface FormFields {
  get(name: string): FormDataEntryValue | null;
  getAll(name: string): FormDataEntryValue[];
}

const text = (f: FormFields, name: string) => {
  const v = f.get(name);
  return typeof v === 'string' ? v.trim() : '';
};
const quantity = (f: FormFields, name: string, required: boolean) => {
  const amount = text(f, `${name}.amount`);
  if (!amount && !required) return null;
  return { amount, unit: text(f, `${name}.unit`) };
};
const checked = (f: FormFields, name: string) => {
  const v = text(f, name);
  return v === 'on' || v === 'true' || v === '1';
};

/** Raw values of a form, for echoing back into it after a failed submit. */
export function formValues(f: FormFields & { keys(): IterableIterator<string> }): Record<string, string | string[]> {
  const out: Record<string, string | string[]> = {};
  for (const key of new Set(f.keys())) {
    if (key.startsWith('$ACTION')) continue;
    const all = f.getAll(key).filter((v): v is string => typeof v === 'string');
    out[key] = all.length > 1 || key === 'pests' ? all : (all[0] ?? '');
  }
  return out;
}

/** The trial form's fields as the input TrialCreateSchema / TrialUpdateSchema expect. */
export function trialInputFromForm(f: FormFields): Record<string, unknown> {
  const paired = text(f, 'pairedTrialId');
  const input: Record<string, unknown> = {
    setting: text(f, 'setting'),
    preparation: text(f, 'preparation'),
    provenance: text(f, 'provenance'),
    surfaceArea: quantity(f, 'surfaceArea', true),
    bedDepth: quantity(f, 'bedDepth', false),
    species: text(f, 'species'),
    wormMass: quantity(f, 'wormMass', false),
    dose: quantity(f, 'dose', true),
    layerDepth: quantity(f, 'layerDepth', false),
    pairedTrialId: paired ? paired : null,
    isControl: checked(f, 'isControl'),
    region: text(f, 'region'),
    startDate: text(f, 'startDate'),
    checkInEveryDays: text(f, 'checkInEveryDays'),
    notes: typeof f.get('notes') === 'string' ? (f.get('notes') as string) : '',
  };
  if (f.get('feedstockId') !== null) input.feedstockId = text(f, 'feedstockId');
  if (f.get('version') !== null) input.version = text(f, 'version');
  return input;
}

/** The check-in form's fields as CheckInCreateSchema expects them. */
export function checkInInputFromForm(f: FormFields): Record<string, unknown> {
  const temp = text(f, 'bedTemp.value');
  const ph = text(f, 'ph');
  return {
    observedOn: text(f, 'observedOn'),
    utcOffsetMinutes: text(f, 'utcOffsetMinutes') || 0,
    wormActivity: text(f, 'wormActivity'),
    shareRemainingPct: text(f, 'shareRemainingPct'),
    bedTemp: temp ? { value: temp, unit: text(f, 'bedTemp.unit') || 'C' } : null,
    mould: checked(f, 'mould'),
    smell: text(f, 'smell') || 'none',
    moisture: text(f, 'moisture') || 'damp',
    ph: ph ? ph : null,
    pests: f.getAll('pests').filter((p): p is string => typeof p === 'string'),
    wormDeaths: checked(f, 'wormDeaths'),
    exodus: checked(f, 'exodus'),
    notes: typeof f.get('notes') === 'string' ? (f.get('notes') as string) : '',
  };
}

/** The close form's fields as TrialCloseSchema expects them. */
export function closeInputFromForm(f: FormFields): Record<string, unknown> {
  const outcome = text(f, 'outcome');
  return { status: text(f, 'status') || 'closed', outcome: outcome || null, reason: text(f, 'reason') };
}
