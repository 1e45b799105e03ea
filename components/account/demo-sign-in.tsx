'use client';

import { useActionState } from 'react';
import { signInAsDemo } from '@/app/signin/actions';
import { buttonClasses } from '@/components/ui';
import type { ActionState } from '@/lib/errors';
import { FormMessage } from './form-message';

export type DemoSignInButtonProps = { role: string; name: string; description: string; available: boolean };

/** One demo account: a button that signs in as that invented person (demo mode only). */
export function DemoSignInButton({ role, name, description, available }: DemoSignInButtonProps) {
  const [state, action, pending] = useActionState<ActionState, FormData>(signInAsDemo, { ok: false });
  return (
    <form action={action} className="flex flex-col gap-1">
      <input type="hidden" name="role" value={role} />
      <button type="submit" disabled={!available || pending} className={buttonClasses('secondary', 'md', 'w-full justify-start text-left')}>
        <span>
          Sign in as {name} <span className="font-normal text-ink-muted">({role})</span>
        </span>
      </button>
      <p className="text-sm text-ink-muted">{available ? description : 'Not in this database.'}</p>
      <FormMessage state={state} />
    </form>
  );
}
