import type { Metadata } from 'next';
import Link from 'next/link';
import { redirect } from 'next/navigation';
import { LicenceForm } from '@/components/account/licence-form';
import { ROLE_DESCRIPTIONS } from '@/components/account/role-descriptions';
import { SignOutButton } from '@/components/account/sign-out-button';
import { UnitsForm } from '@/components/account/units-form';
import { SubscriptionList } from '@/components/subscription/subscription-list';
import { Badge, buttonClasses, Card } from '@/components/ui';
import { getActor } from '@/lib/auth/actor';
import { getAccount } from '@/lib/queries/accounts';
import { listMySubscriptions } from '@/lib/queries/subscriptions';
import { CONTRIBUTION_LICENCE } from '@/lib/services/accounts';

export const metadata: Metadata = { title: 'Your account' };
export const dynamic = 'force-dynamic';

const dateFormat = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });

export default async function AccountPage() {
  const actor = await getActor();
  if (!actor) redirect('/signin?callbackUrl=/account');
  const [account, subscriptions] = await Promise.all([getAccount(actor), listMySubscriptions(actor)]);

  return (
    <div className="mx-auto max-w-prose space-y-8">
      <header className="space-y-2">
        <h1 className="text-4xl">Your account</h1>
        {account.isDemo ? <Badge tone="outline">Demo account: an invented person</Badge> : null}
      </header>

      <Card as="section" aria-labelledby="who-heading" className="space-y-3">
        <h2 id="who-heading" className="text-2xl">
          Who you are here
        </h2>
        <dl className="grid gap-x-4 gap-y-2 sm:grid-cols-[10rem_1fr]">
          <dt className="font-semibold">E-mail</dt>
          <dd className="break-all">
            {account.email} {account.emailVerified ? <span className="text-ink-muted">(confirmed)</span> : <span className="text-ink-muted">(not confirmed yet)</span>}
          </dd>
          <dt className="font-semibold">Role</dt>
          <dd>
            <span className="font-semibold capitalize">{account.role}</span> — {ROLE_DESCRIPTIONS[account.role]}
          </dd>
          <dt className="font-semibold">Member since</dt>
          <dd>{dateFormat.format(new Date(account.joinedAt))}</dd>
        </dl>
        {account.can.manageUsers ? (
          <p>
            <Link href="/admin/users" className={buttonClasses('secondary')}>
              Manage users and roles
            </Link>
          </p>
        ) : null}
      </Card>

      <Card as="section" aria-labelledby="units-heading" className="space-y-3">
        <h2 id="units-heading" className="text-2xl">
          Units
        </h2>
        <UnitsForm units={account.units} />
      </Card>

      <Card as="section" aria-labelledby="licence-heading" className="space-y-3">
        <h2 id="licence-heading" className="text-2xl">
          Contribution licence
        </h2>
        {account.role === 'reader' ? (
          <>
            <p>
              Readers can read and subscribe. To log trials, propose verdicts and vote, accept the contribution licence: what you
              write and record is shared with everyone under{' '}
              <a href={CONTRIBUTION_LICENCE.url}>{CONTRIBUTION_LICENCE.name}</a>, like the rest of the site.
            </p>
            {account.can.acceptLicence ? (
              <LicenceForm licenceName={CONTRIBUTION_LICENCE.name} licenceUrl={CONTRIBUTION_LICENCE.url} />
            ) : (
              <p className="font-semibold">Confirm your e-mail address first: sign out and sign in once with an e-mail link.</p>
            )}
          </>
        ) : account.licenceAcceptedAt ? (
          <p>
            You accepted the contribution licence on {dateFormat.format(new Date(account.licenceAcceptedAt))}: what you contribute
            is shared under <a href={CONTRIBUTION_LICENCE.url}>{CONTRIBUTION_LICENCE.name}</a>.
          </p>
        ) : (
          <p>
            Your contributions are shared under <a href={CONTRIBUTION_LICENCE.url}>{CONTRIBUTION_LICENCE.name}</a>.
          </p>
        )}
      </Card>

      <Card as="section" aria-labelledby="subscriptions-heading" className="space-y-3">
        <h2 id="subscriptions-heading" className="text-2xl">
          Subscriptions
        </h2>
        <SubscriptionList subscriptions={subscriptions.subscriptions} />
        <p className="text-sm text-ink-muted">
          Mail goes to {account.email}. Every mail also has a one-click unsubscribe link that works without signing in.
        </p>
      </Card>

      <section aria-labelledby="signout-heading" className="space-y-2">
        <h2 id="signout-heading" className="text-2xl">
          Sign out
        </h2>
        <p>Signing out ends this session on this device.</p>
        <div className="flex">
          <SignOutButton className={buttonClasses('secondary')} />
        </div>
      </section>
    </div>
  );
}
