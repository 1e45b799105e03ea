'use server';

import { redirect } from 'next/navigation';
import { getActor } from '@/lib/auth/actor';
import { toActionState, type ActionState } from '@/lib/errors';
import { parseId } from '@/lib/http/params';
import { revalidateTrial } from '@/lib/http/revalidate';
import { addCheckIn, closeTrial, createTrial, updateTrial } from '@/lib/services/trials';
import { checkInInputFromForm, closeInputFromForm, formValues, trialInputFromForm } from '@/lib/validation/trials';

/** What the trial forms get back: the outcome, field messages, and what was typed. */
export type FormState = ActionState & { values?: Record<string, string | string[]>; id?: number };

/** Logs a trial from the new-trial form, then opens its page. */
export async function createTrialAction(_prev: FormState, formData: FormData): Promise<FormState> {
  let id: number;
  try {
    ({ id } = await createTrial(await getActor(), trialInputFromForm(formData)));
    await revalidateTrial(id);
  } catch (err) {
    return { ...toActionState(err), values: formValues(formData) };
  }
  redirect(`/trials/${id}`);
}

/** Saves the edit form of a trial (its id in the `trialId` field), then opens its page. */
export async function updateTrialAction(_prev: FormState, formData: FormData): Promise<FormState> {
  let trialId: number;
  try {
    trialId = parseId(String(formData.get('trialId') ?? ''));
    await updateTrial(await getActor(), trialId, trialInputFromForm(formData));
    await revalidateTrial(trialId);
  } catch (err) {
    return { ...toActionState(err), values: formValues(formData) };
  }
  redirect(`/trials/${trialId}`);
}

/** Adds a check-in; returns its id so the form can upload its photos next. */
export async function addCheckInAction(_prev: FormState, formData: FormData): Promise<FormState> {
  let trialId: number;
  try {
    trialId = parseId(String(formData.get('trialId') ?? ''));
    const { id } = await addCheckIn(await getActor(), trialId, checkInInputFromForm(formData));
    await revalidateTrial(trialId);
    return { ok: true, id, message: 'Check-in saved.' };
  } catch (err) {
    return { ...toActionState(err), values: formValues(formData) };
  }
}

/** Closes or abandons a trial with the confirmed (or corrected) outcome. */
export async function closeTrialAction(_prev: FormState, formData: FormData): Promise<FormState> {
  let trialId: number;
  try {
    trialId = parseId(String(formData.get('trialId') ?? ''));
    await closeTrial(await getActor(), trialId, closeInputFromForm(formData));
    await revalidateTrial(trialId);
    return { ok: true, message: 'Trial closed.' };
  } catch (err) {
    return { ...toActionState(err), values: formValues(formData) };
  }
}
