'use client';

import Link from 'next/link';
import { useActionState, useState } from 'react';
import { requestSignInLink, type SignInFormState } from '@/app/signin/actions';
import { Button, Field } from '@/components/ui';
import { fieldError, FormMessage } from './form-message';

export type SignInFormProps = {
  /** Where to go after the link is opened (a path on this site). */
  callbackUrl?: string;
  /** True when /dev/mailbox shows captured mail (demo mode or MAILBOX=1). */
  mailboxEnabled: boolean;
};

/** E-mail sign-in: one address field; after sending, a "check your e-mail" panel. */
export function SignInForm({ callbackUrl, mailboxEnabled }: SignInFormProps) {
  const [state, action, pending] = useActionState<SignInFormState, FormData>(requestSignInLink, { ok: false });
  const [again, setAgain] = useState(false);

  if (state.ok && state.email && !again) {
    return (
      <div role="status" className="space-y-3 rounded-lg border border-accent bg-accent-soft p-4">
        <h2 className="text-2xl">Check your e-mail</h2>
        <p>
          We sent a sign-in link to <strong>{state.email}</strong>. Open it on this device to sign in. It works once and for the
          next 24 hours.
        </p>
        <p className="text-sm text-ink-muted">Nothing arrived after a few minutes? Look in your spam folder, or send another link.</p>
        {mailboxEnabled ? (
          <p className="text-sm">
            Running Trialbed locally? Mail is caught on this machine: <Link href="/dev/mailbox">open the local mailbox</Link>.
          </p>
        ) : null}
        <Button variant="secondary" onClick={() => setAgain(true)}>
          Use another address or send again
        </Button>
      </div>
    );
  }

  return (
    <form action={(fd) => { setAgain(false); action(fd); }} className="space-y-4" noValidate>
      {callbackUrl ? <input type="hidden" name="callbackUrl" value={callbackUrl} /> : null}
      <Field
        label="E-mail address"
        name="email"
        type="email"
        autoComplete="email"
        inputMode="email"
        required
        defaultValue={state.email}
        hint="We e-mail you a link; no password needed. A new address gets a new reader account."
        error={fieldError(state, 'email')}
      />
      <Button type="submit" size="lg" disabled={pending} className="w-full sm:w-auto">
        {pending ? 'Sending the link…' : 'E-mail me a sign-in link'}
      </Button>
      <FormMessage state={state} />
    </form>
  );
}
