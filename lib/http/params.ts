import { z } from 'zod';
import { NotFoundError } from '@/lib/errors';

const IdSchema = z.coerce.number().int().positive().max(2 ** 31);

/** Parses a numeric id from a route segment; anything else is a 404, never a 500. */
export function parseId(raw: string | undefined): number {
  const r = IdSchema.safeParse(raw);
  if (!r.success) throw new NotFoundError();
  return r.data;
}
