'use server';

import { revalidatePath } from 'next/cache';
import { getActor } from '@/lib/auth/actor';
import { toActionState, type ActionState } from '@/lib/errors';
import { acceptLicence, updateAccountSettings } from '@/lib/services/accounts';

/** Saves the units preference (metric or imperial). */
export async function saveUnits(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
    const { units } = await updateAccountSettings(await getActor(), { units: formData.get('units') ?? undefined });
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
