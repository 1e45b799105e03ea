import type { Metadata } from 'next';
import Link from 'next/link';
import { DemoSignInButton } from '@/components/account/demo-sign-in';
import { ROLE_DESCRIPTIONS } from '@/components/account/role-descriptions';
import { SignInForm } from '@/components/account/sign-in-form';
import { Card } from '@/components/ui';
import { getActor } from '@/lib/auth/actor';
import { isMailboxEnabled } from '@/lib/env';
import { listDemoAccounts } from '@/lib/queries/accounts';
import { ReturnPathSchema } from '@/lib/validation/accounts';

export const metadata: Metadata = { title: 'Sign in' };
export const dynamic = 'force-dynamic';

/** Auth.js error codes that reach this page, in plain words. */
const ERRORS: Record<string, string> = {
  Verification: 'That sign-in link has expired or was already used. Ask for a new one below.',
  AccessDenied: 'This account cannot sign in. If you think that is a mistake, ask the site admins.',
  EmailSignin: 'We could not send the e-mail. Please try again in a minute.',
};

type SearchParams = Promise<Record<string, string | string[] | undefined>>;
const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);

export default async function SignInPage({ searchParams }: { searchParams: SearchParams }) {
  const params = await searchParams;
  const callbackUrl = ReturnPathSchema.parse(one(params.callbackUrl));
  const error = one(params.error);
  const signedOut = one(params['signed-out']) === '1';
  const [actor, demoAccounts] = await Promise.all([getActor(), listDemoAccounts()]);

  return (
    <div className="mx-auto max-w-prose space-y-8">
      <header className="space-y-2">
        <h1 className="text-4xl">Sign in</h1>
        <p className="text-lg">
          Anyone can read Trialbed without an account. Sign in to subscribe to feedstocks, set your units, and — once you accept
          the contribution licence — log trials and vote.
        </p>
      </header>

      {signedOut ? (
        <p role="status" className="rounded-lg border border-line bg-surface-raised p-4 font-semibold">
          You are signed out.
        </p>
      ) : null}
      {error ? (
        <p role="alert" className="rounded-lg border-2 border-danger bg-surface-raised p-4 font-semibold text-danger">
          {ERRORS[error] ?? 'Signing in did not work. Please try again.'}
        </p>
      ) : null}

      {actor ? (
        <Card className="space-y-2">
          <p>
            You are signed in as <strong>{actor.email}</strong> ({actor.role}).
          </p>
          <p>
            <Link href={callbackUrl ?? '/account'}>Continue to {callbackUrl && callbackUrl !== '/account' ? 'the page you asked for' : 'your account'}</Link>
          </p>
        </Card>
      ) : (
        <Card as="section" aria-labelledby="email-heading" className="space-y-4">
          <h2 id="email-heading" className="text-2xl">
            With an e-mail link
          </h2>
          <SignInForm callbackUrl={callbackUrl} mailboxEnabled={isMailboxEnabled()} />
        </Card>
      )}

      {demoAccounts.length ? (
        <section aria-labelledby="demo-heading" className="space-y-3 rounded-lg border border-line bg-surface-sunken p-4 sm:p-5">
          <h2 id="demo-heading" className="text-2xl">
            Demo accounts
          </h2>
          <p>
            This site runs in demo mode: try each role as one of the invented people of the demo scenario, without e-mail.
            {actor ? ' Choosing one replaces your current session.' : null}
          </p>
          <ul className="grid list-none gap-4 p-0 sm:grid-cols-2">
            {demoAccounts.map((d) => (
              <li key={d.role}>
                <DemoSignInButton role={d.role} name={d.name} description={ROLE_DESCRIPTIONS[d.role]} available={d.available} />
              </li>
            ))}
          </ul>
        </section>
      ) : null}
    </div>
  );
}
