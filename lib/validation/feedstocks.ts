import { z } from 'zod';

/** Shared zod schemas for search, the feedstock index, page edits and feedstock management. */

export const SETTINGS = ['bin', 'flow-through', 'bed'] as const;
export const VERDICTS = ['feed', 'limit', 'prepare', 'avoid', 'unsettled'] as const;
export const CATEGORIES = ['fruit', 'vegetable', 'grain-starch', 'paper-card', 'garden', 'manure', 'animal-product', 'other'] as const;
export const HANDLING_CAUTIONS = ['manure', 'mould', 'dust', 'shredder', 'pathogens', 'rodents'] as const;
export const INDEX_SORTS = ['name', 'category', 'certainty', 'trials', 'changed'] as const;

/** Longest page text we store (characters). */
export const MAX_PAGE_TEXT = 60_000;

/** GET /api/search?q=…&limit=… */
export const SearchQuerySchema = z.object({
  q: z.string({ message: 'Type what you want to feed your worms.' }).trim().max(120, 'Keep the question under 120 characters.').default(''),
  limit: z.coerce.number({ message: 'limit must be a number.' }).int('limit must be a whole number.').min(1, 'limit is at least 1.').max(20, 'limit is at most 20.').default(8),
});
export type SearchQueryInput = z.infer<typeof SearchQuerySchema>;

const one = (v: unknown) => (Array.isArray(v) ? v[0] : v);

/**
 * The feedstock index's URL state. Unknown or malformed values fall back to
 * the defaults (a hand-edited URL still shows a page), and each fallback is
 * reported so the page can say what it ignored.
 */
export const FeedstockIndexParamsSchema = z.object({
  category: z.preprocess(one, z.enum(CATEGORIES).optional()).catch(undefined),
  setting: z.preprocess(one, z.enum(SETTINGS).optional()).catch(undefined),
  verdict: z.preprocess(one, z.enum(VERDICTS).optional()).catch(undefined),
  q: z.preprocess(one, z.string().trim().max(120).optional()).catch(undefined),
  sort: z.preprocess(one, z.enum(INDEX_SORTS).default('name')).catch('name'),
  dir: z.preprocess(one, z.enum(['asc', 'desc']).default('asc')).catch('asc'),
  page: z.preprocess(one, z.coerce.number().int().min(1).max(10_000).default(1)).catch(1),
  per: z.preprocess(one, z.coerce.number().int().pipe(z.union([z.literal(25), z.literal(50), z.literal(100)])).default(50)).catch(50),
});
export type FeedstockIndexParams = z.infer<typeof FeedstockIndexParamsSchema>;

const pageText = z
  .string({ message: 'Write the page text.' })
  .max(MAX_PAGE_TEXT, `Keep the page under ${MAX_PAGE_TEXT.toLocaleString('en-GB')} characters.`)
  .transform((s) => s.replace(/\r\n?/g, '\n'));

const version = (what: string) => z.coerce.number({ message: `${what} is missing; reload the page.` }).int().min(0);

/** A page-text edit: the new text, a short summary, and the text version it was made against. */
export const PageEditSchema = z.object({
  body: pageText.refine((s) => s.trim().length > 0, 'The page text cannot be empty.'),
  editSummary: z.string().trim().max(255, 'Keep the summary under 255 characters.').default(''),
  baseVersion: version('The text version'),
});
export type PageEditInput = z.infer<typeof PageEditSchema>;

/** An editor's decision on a suggested edit; a rejection needs a note for the author. */
export const EditReviewSchema = z
  .object({
    decision: z.enum(['approve', 'reject'], { message: 'Choose approve or reject.' }),
    note: z.string().trim().max(2_000, 'Keep the note under 2,000 characters.').default(''),
  })
  .superRefine((v, ctx) => {
    if (v.decision === 'reject' && v.note.length < 3) ctx.addIssue({ code: 'custom', path: ['note'], message: 'Tell the author why, so they can revise it.' });
  });
export type EditReviewInput = z.infer<typeof EditReviewSchema>;

/** Revert the page text to an earlier published revision (as a new revision). */
export const RevertSchema = z.object({
  revisionId: z.coerce.number({ message: 'Choose a revision.' }).int().positive('Choose a revision.'),
  baseVersion: version('The text version'),
  editSummary: z.string().trim().max(200).default(''),
});
export type RevertInput = z.infer<typeof RevertSchema>;

/** Addresses under /feedstocks/ that are pages of their own. */
export const RESERVED_SLUGS = ['new', 'request'];

/** A URL slug: lower-case words joined by hyphens. */
export const SlugSchema = z
  .string()
  .trim()
  .toLowerCase()
  .min(2, 'The address needs at least 2 characters.')
  .max(120, 'Keep the address under 120 characters.')
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Use lower-case letters, digits and single hyphens (like "orange-peel").')
  .refine((s) => !RESERVED_SLUGS.includes(s), 'That address is used by the site itself; choose another.');

/** Turns a name into a slug ("Orange peel (waxed)" → "orange-peel-waxed"). */
export function slugify(name: string): string {
  return name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/&/g, ' and ')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 120)
    .replace(/-+$/g, '');
}

const name = z.string({ message: 'Give it a name.' }).trim().min(2, 'The name needs at least 2 characters.').max(160, 'Keep the name under 160 characters.');

const listOf = <T extends z.ZodTypeAny>(item: T, max: number) =>
  z.preprocess((v) => {
    if (v === undefined || v === null || v === '') return [];
    if (typeof v === 'string') return v.split(/[,\n]/).map((s) => s.trim()).filter(Boolean);
    return v;
  }, z.array(item).max(max, `At most ${max}.`));

/** A new feedstock. */
export const FeedstockCreateSchema = z.object({
  name,
  slug: z.preprocess((v) => (v === '' ? undefined : v), SlugSchema.optional()),
  category: z.enum(CATEGORIES, { message: 'Choose a category.' }),
  family: z.preprocess((v) => (v === '' ? null : v), z.string().trim().max(80, 'Keep the family under 80 characters.').nullish()),
  summary: z.string().trim().max(500, 'Keep the summary under 500 characters.').default(''),
  pageText: pageText.default(''),
  aliases: listOf(z.string().trim().toLowerCase().min(2, 'Each other name needs at least 2 characters.').max(160), 20).default([]),
  handlingCautions: listOf(z.enum(HANDLING_CAUTIONS), HANDLING_CAUTIONS.length).default([]),
  requestId: z.preprocess((v) => (v === '' ? undefined : v), z.coerce.number().int().positive().optional()),
});
export type FeedstockCreateInput = z.infer<typeof FeedstockCreateSchema>;

/** A new name and/or address for a feedstock; the old address keeps working. */
export const FeedstockRenameSchema = z.object({
  name,
  slug: SlugSchema,
});
export type FeedstockRenameInput = z.infer<typeof FeedstockRenameSchema>;

/** Merge one feedstock (the source) into another (the target). */
export const FeedstockMergeSchema = z
  .object({
    sourceId: z.coerce.number({ message: 'Choose the feedstock to merge.' }).int().positive(),
    targetId: z.coerce.number({ message: 'Choose the feedstock to merge into.' }).int().positive('Choose the feedstock to merge into.'),
    note: z.string().trim().max(1_000).default(''),
  })
  .refine((v) => v.sourceId !== v.targetId, { path: ['targetId'], message: 'A feedstock cannot be merged into itself.' });
export type FeedstockMergeInput = z.infer<typeof FeedstockMergeSchema>;

/** A reader's request for a feedstock the site does not have. */
export const FeedstockRequestSchema = z.object({
  name: z.string({ message: 'Name the feedstock.' }).trim().min(2, 'Name the feedstock (at least 2 characters).').max(160, 'Keep the name under 160 characters.'),
  note: z.string().trim().max(2_000, 'Keep the note under 2,000 characters.').default(''),
});
export type FeedstockRequestInput = z.infer<typeof FeedstockRequestSchema>;

/** An editor closing a request. */
export const RequestDecisionSchema = z.object({
  requestId: z.coerce.number().int().positive(),
  status: z.enum(['declined', 'open'], { message: 'Choose decline or reopen.' }),
});
export type RequestDecisionInput = z.infer<typeof RequestDecisionSchema>;
