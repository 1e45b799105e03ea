import type { Metadata } from 'next';
import Link from 'next/link';
import { isMailboxEnabled } from '@/lib/env';

export const metadata: Metadata = { title: 'Check your e-mail' };
export const dynamic = 'force-dynamic';

/** Where Auth.js sends a browser after a sign-in link went out through /api/auth directly. */
export default function CheckEmailPage() {
  return (
    <div className="mx-auto max-w-prose space-y-4">
      <h1 className="text-4xl">Check your e-mail</h1>
      <p className="text-lg">We sent you a sign-in link. Open it on this device to sign in; it works once and for the next 24 hours.</p>
      {isMailboxEnabled() ? (
        <p>
          Running Trialbed locally? Mail is caught on this machine: <Link href="/dev/mailbox">open the local mailbox</Link>.
        </p>
      ) : null}
      <p>
        <Link href="/signin">Back to sign-in</Link>
      </p>
    </div>
  );
}
