'use client';

import Link from 'next/link';
import { useActionState } from 'react';
import { confirmSubscriptionFromLink, unsubscribeFromLink } from '@/app/subscriptions/actions';
import { FormMessage } from '@/components/account/form-message';
import { Button } from '@/components/ui';
import type { ActionState } from '@/lib/errors';

const ACTIONS = { confirm: confirmSubscriptionFromLink, unsubscribe: unsubscribeFromLink } as const;

/**
 * The one button of the pages a mailed link opens (confirm a subscription,
 * unsubscribe). Opening the link only shows the page; the change happens when
 * the person presses the button, so link scanners and previews change nothing.
 */
export function TokenActionForm({ kind, token, label }: { kind: keyof typeof ACTIONS; token: string; label: string }) {
  const [state, action, pending] = useActionState<ActionState, FormData>(ACTIONS[kind], { ok: false });
  if (state.ok) {
    return (
      <div role="status" className="space-y-2 rounded-md bg-accent-soft p-3">
        <p className="font-semibold text-accent-strong">{state.message}</p>
        <p>
          {kind === 'confirm' ? 'Every mail has a one-click unsubscribe link. ' : 'Changed your mind? Follow again from any feedstock page. '}
          <Link href="/feedstocks">Browse feedstocks</Link>
        </p>
      </div>
    );
  }
  return (
    <form action={action} className="space-y-3">
      <input type="hidden" name="token" value={token} />
      <Button type="submit" size="lg" variant={kind === 'unsubscribe' ? 'danger' : 'primary'} disabled={pending}>
        {pending ? 'One moment…' : label}
      </Button>
      <FormMessage state={state} />
    </form>
  );
}
