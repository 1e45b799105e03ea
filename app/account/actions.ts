'use server';

import { revalidatePath } from 'next/cache';
import { cookies } from 'next/headers';
import { getActor } from '@/lib/auth/actor';
import { toActionState, type ActionState } from '@/lib/errors';
import { acceptLicence, updateAccountSettings } from '@/lib/services/accounts';
import { UNITS_COOKIE, UNITS_COOKIE_MAX_AGE } from '@/lib/units-cookie';

/**
 * Saves the units preference (metric or imperial) in the profile and in the
 * `units` cookie, which is what pages read in the browser (lib/units-cookie.ts).
 */
export async function saveUnits(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
    const { units } = await updateAccountSettings(await getActor(), { units: formData.get('units') ?? undefined });
    (await cookies()).set(UNITS_COOKIE, units, { path: '/', maxAge: UNITS_COOKIE_MAX_AGE, sameSite: 'lax' });
    revalidatePath('/account');
    return { ok: true, message: units === 'metric' ? 'Saved: doses show in metric units.' : 'Saved: doses show in imperial units.' };
  } catch (err) {
    return toActionState(err);
  }
}

/** A reader accepts the contribution licence and becomes a contributor. */
export async function acceptContributionLicence(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
    await acceptLicence(await getActor(), { accept: formData.get('accept') ?? undefined });
    // The page re-renders as a contributor's (role, date of acceptance).
    revalidatePath('/account');
    return { ok: true, message: 'Thank you. You are now a contributor: you can log trials, propose verdicts and vote.' };
  } catch (err) {
    return toActionState(err);
  }
}
