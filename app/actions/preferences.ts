'use server';

import { cookies } from 'next/headers';
import { z } from 'zod';
import { UNITS } from '@/lib/format';
import { UNITS_COOKIE } from '@/lib/preferences';

const UnitsSchema = z.enum(UNITS);

/** Keeps the reader's units (metric / imperial) in a cookie for a year. Unknown values are ignored. */
export async function setUnitsAction(formData: FormData): Promise<void> {
  const parsed = UnitsSchema.safeParse(formData.get('units'));
  if (!parsed.success) return;
  (await cookies()).set(UNITS_COOKIE, parsed.data, { path: '/', maxAge: 60 * 60 * 24 * 365, sameSite: 'lax' });
}
