'use server';

import { cookies } from 'next/headers';
import { z } from 'zod';
import { UNITS } from '@/lib/format';
import { UNITS_COOKIE } from '@/lib/preferences';
import type { ActionState } from '@/lib/errors';

const UnitsSchema = z.enum(UNITS);

/** Keeps the reader's units (metric / imperial) in a cookie for a year. Unknown values are ignored. */
export async function setUnitsAction(_prev: ActionState, formData: FormData): Promise<ActionState> {
  const parsed = UnitsSchema.safeParse(formData.get('units'));
  if (!parsed.success) return { ok: false, code: 'invalid_input', message: 'Choose metric or imperial.', fieldErrors: { units: ['Choose metric or imperial.'] } };
  (await cookies()).set(UNITS_COOKIE, parsed.data, { path: '/', maxAge: 60 * 60 * 24 * 365, sameSite: 'lax' });
  return { ok: true };
}
