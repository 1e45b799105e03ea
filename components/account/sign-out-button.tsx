'use client';

import { useActionState } from 'react';
import { signOutUser } from '@/app/signin/actions';
import type { ActionState } from '@/lib/errors';

export type SignOutButtonProps = { className: string };

/** "Sign out": a one-button form; the server action ends the session and goes to /signin. */
export function SignOutButton({ className }: SignOutButtonProps) {
  const [state, action, pending] = useActionState<ActionState, FormData>(signOutUser, { ok: false });
  return (
    <form action={action} className="contents">
      <button type="submit" className={className} disabled={pending}>
        {pending ? 'Signing out…' : 'Sign out'}
      </button>
      {state.message ? (
        <span role="alert" className="text-sm text-danger">
          {state.message}
        </span>
      ) : null}
    </form>
  );
}
