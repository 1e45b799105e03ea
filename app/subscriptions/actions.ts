'use server';

import { revalidatePath } from 'next/cache';
import { headers } from 'next/headers';
import { getActor } from '@/lib/auth/actor';
import { clientIpFrom } from '@/lib/auth/client-ip';
import { toActionState, type ActionState } from '@/lib/errors';
import {
  changeSubscriptionMode,
  confirmSubscription,
  endSubscription,
  subscribe,
  unsubscribeWithToken,
} from '@/lib/services/subscriptions';

/** The subscribe panel's state: after success, whether it counts already and where the mail goes. */
export type SubscribeFormState = ActionState & { status?: 'following' | 'confirmation-sent'; email?: string };

const field = (formData: FormData, name: string) => {
  const v = formData.get(name);
  return typeof v === 'string' ? v : undefined;
};

/**
 * Follows a feedstock (field `feedstockId`; empty for every feedstock) with
 * `mode` immediate|digest: at once for a signed-in reader, or by a mailed
 * confirmation link for a visitor's `email`.
 */
export async function subscribeToUpdates(_prev: SubscribeFormState, formData: FormData): Promise<SubscribeFormState> {
  const typed = field(formData, 'email')?.slice(0, 254);
  try {
    const r = await subscribe(
      await getActor(),
      { feedstockId: field(formData, 'feedstockId') ?? null, mode: field(formData, 'mode'), email: typed },
      { clientIp: clientIpFrom(await headers()) },
    );
    const how = r.mode === 'digest' ? 'a weekly digest' : 'an e-mail for each update';
    return {
      ok: true,
      status: r.status,
      email: r.email,
      message:
        r.status === 'following'
          ? `You follow ${r.scope.name}: ${how} goes to ${r.email}.`
          : `We sent a confirmation link to ${r.email}. Nothing else is sent until you open it.`,
    };
  } catch (err) {
    return { ...toActionState(err), email: typed };
  }
}

/** Confirms a visitor's subscription from the mailed link (field `token`). */
export async function confirmSubscriptionFromLink(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
    const r = await confirmSubscription({ token: field(formData, 'token') });
    return { ok: true, message: `Confirmed: you follow ${r.scope.name} (${r.mode === 'digest' ? 'weekly digest' : 'each update as it happens'}).` };
  } catch (err) {
    return toActionState(err);
  }
}

/** Switches one of your subscriptions between each update and the weekly digest (`subscriptionId`, `mode`). */
export async function setSubscriptionMode(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
    const r = await changeSubscriptionMode(await getActor(), { subscriptionId: field(formData, 'subscriptionId'), mode: field(formData, 'mode') });
    revalidatePath('/account');
    return { ok: true, message: r.mode === 'digest' ? `${r.scope.name}: weekly digest.` : `${r.scope.name}: each update as it happens.` };
  } catch (err) {
    return toActionState(err);
  }
}

/** Stops one of your subscriptions from the account page (`subscriptionId`). */
export async function stopSubscription(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
    const r = await endSubscription(await getActor(), { subscriptionId: field(formData, 'subscriptionId') });
    // No revalidation: the row stays on screen with this message (the page is rendered fresh on the next visit).
    return { ok: true, message: `Stopped: no more mail about ${r.scope.name}.` };
  } catch (err) {
    return toActionState(err);
  }
}

/** The button on the unsubscribe page: unsubscribes with the mail's signed token (`token`); no sign-in needed. */
export async function unsubscribeFromLink(_prev: ActionState, formData: FormData): Promise<ActionState> {
  try {
    const r = await unsubscribeWithToken({ token: field(formData, 'token') });
    return {
      ok: true,
      message: r.alreadyUnsubscribed ? `${r.maskedEmail} was already unsubscribed from ${r.scopes.join(', ')}.` : `Done: ${r.maskedEmail} gets no more mail about ${r.scopes.join(', ')}.`,
    };
  } catch (err) {
    return toActionState(err);
  }
}
