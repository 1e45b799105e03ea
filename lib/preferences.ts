import 'server-only';
import { cookies } from 'next/headers';
import { parseUnits, type Units } from '@/lib/format';

/** The cookie that keeps a reader's units choice (until it moves to their profile). */
export const UNITS_COOKIE = 'units';

/** The reader's units: the `units` cookie, metric by default. Makes the page dynamic. */
export async function getUnits(): Promise<Units> {
  return parseUnits((await cookies()).get(UNITS_COOKIE)?.value);
}
