'use client';

import { useActionState } from 'react';
import { setSubscriptionMode, stopSubscription } from '@/app/subscriptions/actions';
import { FormMessage } from '@/components/account/form-message';
import { Button } from '@/components/ui';
import type { ActionState } from '@/lib/errors';
import type { SubscriptionMode } from '@/lib/validation/subscriptions';
import { MODE_LABELS } from './mode-choice';

/** One subscription's controls on the account page: switch the mode, or stop it. */
export function SubscriptionControls({ id, name, mode }: { id: number; name: string; mode: SubscriptionMode }) {
  const [modeState, modeAction, modePending] = useActionState<ActionState, FormData>(setSubscriptionMode, { ok: false });
  const [stopState, stopAction, stopPending] = useActionState<ActionState, FormData>(stopSubscription, { ok: false });
  const other: SubscriptionMode = mode === 'digest' ? 'immediate' : 'digest';
  if (stopState.ok) {
    return (
      <p role="status" className="font-semibold text-accent-strong">
        {stopState.message}
      </p>
    );
  }
  return (
    <div className="space-y-1">
      <div className="flex flex-wrap gap-2">
        <form action={modeAction}>
          <input type="hidden" name="subscriptionId" value={id} />
          <input type="hidden" name="mode" value={other} />
          <Button type="submit" variant="secondary" disabled={modePending} aria-label={`${name}: switch to ${MODE_LABELS[other].toLowerCase()}`}>
            {modePending ? 'Saving…' : `Switch to ${other === 'digest' ? 'weekly digest' : 'each update'}`}
          </Button>
        </form>
        <form action={stopAction}>
          <input type="hidden" name="subscriptionId" value={id} />
          <Button type="submit" variant="danger" disabled={stopPending} aria-label={`Unsubscribe from ${name}`}>
            {stopPending ? 'Stopping…' : 'Unsubscribe'}
          </Button>
        </form>
      </div>
      <FormMessage state={modeState.message ? modeState : stopState} />
    </div>
  );
}
