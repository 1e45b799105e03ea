import { z } from 'zod';
import { zodFieldErrors, type FieldErrors } from '@/lib/errors';

/** Shared zod schemas for the calculator pages (GET forms: values arrive as strings). */

const one = (v: unknown) => (Array.isArray(v) ? v[0] : v);
const blankToUndefined = (v: unknown) => {
  const x = one(v);
  return typeof x === 'string' && x.trim() === '' ? undefined : x;
};
const num = (what: string, min: number, max: number, opts: { exclusiveMin?: boolean } = {}) =>
  z.preprocess(
    blankToUndefined,
    z.coerce
      .number({ message: `${what} must be a number.` })
      .refine((n) => Number.isFinite(n), `${what} must be a number.`)
      .refine((n) => (opts.exclusiveMin ? n > min : n >= min), `${what} must be ${opts.exclusiveMin ? 'more than' : 'at least'} ${min}.`)
      .refine((n) => n <= max, `${what} must be at most ${max.toLocaleString('en-GB')}.`),
  );

/** Number of ingredient rows on the mix form. */
export const MIX_ROWS = 4;

const rowFields = Object.fromEntries(
  Array.from({ length: MIX_ROWS }, (_, i) => [
    [`m${i + 1}`, z.preprocess(blankToUndefined, z.string().max(200).optional())],
    [`q${i + 1}`, num('Amount', 0, 100_000, { exclusiveMin: true }).optional()],
  ]).flat(),
) as Record<string, z.ZodTypeAny>;

/** The mix calculator's URL state. */
export const MixParamsSchema = z
  .object({
    ...rowFields,
    unit: z.preprocess(one, z.enum(['kg', 'lb']).default('kg')).catch('kg'),
    goal: z.preprocess(blankToUndefined, z.enum(['none', 'cn', 'moisture']).default('none')),
    target: num('Target', 0, 1_000, { exclusiveMin: true }).optional(),
    add: z.preprocess(blankToUndefined, z.string().max(200).optional()),
  })
  .superRefine((v, ctx) => {
    const rows = v as Record<string, unknown>;
    for (let i = 1; i <= MIX_ROWS; i++) {
      if (rows[`m${i}`] && rows[`q${i}`] === undefined) ctx.addIssue({ code: 'custom', path: [`q${i}`], message: 'Give an amount for this material.' });
      if (!rows[`m${i}`] && rows[`q${i}`] !== undefined) ctx.addIssue({ code: 'custom', path: [`m${i}`], message: 'Choose a material for this amount.' });
    }
    if (v.goal !== 'none') {
      if (v.target === undefined) ctx.addIssue({ code: 'custom', path: ['target'], message: v.goal === 'cn' ? 'Give the C:N you want, e.g. 25.' : 'Give the moisture you want, e.g. 75.' });
      else if (v.goal === 'moisture' && (v.target as number) >= 100) ctx.addIssue({ code: 'custom', path: ['target'], message: 'Moisture is below 100%.' });
      if (!v.add) ctx.addIssue({ code: 'custom', path: ['add'], message: 'Choose the material to add.' });
    }
  });
export type MixParams = z.infer<typeof MixParamsSchema>;

/** The bin-size and comfort calculator's URL state. */
export const BinSizeParamsSchema = z
  .object({
    scraps: num('Food scraps a week', 0, 10_000, { exclusiveMin: true }).optional(),
    unit: z.preprocess(one, z.enum(['kg', 'lb']).default('kg')).catch('kg'),
    rate: num('Feed rate', 0, 5, { exclusiveMin: true }).optional(),
    temp: num('Bed temperature', -40, 90).optional(),
    tempUnit: z.preprocess(one, z.enum(['C', 'F']).default('C')).catch('C'),
    moisture: num('Moisture', 0, 100).optional(),
    species: z.preprocess(blankToUndefined, z.enum(['eisenia-fetida', 'eisenia-andrei', 'perionyx-excavatus', 'eudrilus-eugeniae']).default('eisenia-fetida')),
  });
export type BinSizeParams = z.infer<typeof BinSizeParamsSchema>;

/** Parses a GET form: the values (or defaults) and, field by field, what was wrong. */
export function parseForm<S extends z.ZodTypeAny>(schema: S, raw: unknown): { data: z.infer<S> | null; errors: FieldErrors } {
  const r = schema.safeParse(raw);
  return r.success ? { data: r.data, errors: {} } : { data: null, errors: zodFieldErrors(r.error) };
}
