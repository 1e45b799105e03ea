import type { Metadata } from 'next';
import Link from 'next/link';
import { TrialForm } from '@/components/trial/trial-form';
import { Card } from '@/components/ui/card';
import { getActor } from '@/lib/auth/actor';
import { can } from '@/lib/policies';
import { listFeedstockChoices, listPairableTrials } from '@/lib/queries/trials';
import { utcDate } from '@/lib/trials/schedule';
import { createTrialAction } from '../actions';

export const dynamic = 'force-dynamic';

export const metadata: Metadata = {
  title: 'Log a trial',
  description: 'Log a feeding trial: what went in, how much, where, and when you will check it.',
};

export default async function NewTrialPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const actor = await getActor();
  const { feedstock: slug } = await searchParams;

  if (!can(actor, 'trial.create')) {
    return (
      <div className="max-w-prose space-y-4">
        <h1 className="text-3xl">Log a trial</h1>
        <Card>
          <p>
            {actor
              ? 'Logging trials is for contributors. Accept the content licence on your account page to become one.'
              : 'Sign in to log a trial. Trials are shared under CC BY-SA 4.0 and feed the evidence on each feedstock’s page.'}
          </p>
          <p className="mt-3">
            {actor ? <Link href="/account">Your account</Link> : <Link href="/signin?callbackUrl=%2Ftrials%2Fnew">Sign in</Link>}
          </p>
        </Card>
      </div>
    );
  }

  const [feedstocks, pairable] = await Promise.all([listFeedstockChoices(), listPairableTrials(actor!.id)]);
  const preselected = typeof slug === 'string' ? feedstocks.find((f) => f.slug === slug) : undefined;

  return (
    <div className="max-w-3xl space-y-6">
      <header className="space-y-2">
        <h1 className="text-3xl">Log a trial</h1>
        <p className="text-ink-muted">
          Put a measured amount of one feedstock in one bed or bin, note how you prepared it, and check it on a schedule. A paired plot
          (prepared against raw, or a control with your usual feed) makes the trial stronger.
        </p>
        <p className="text-sm">
          <strong>Privacy:</strong> Trialbed stores a region (a town or county), never an address, and removes location and camera details
          from photos.
        </p>
      </header>
      <TrialForm
        mode="create"
        action={createTrialAction}
        feedstocks={feedstocks}
        pairable={pairable}
        initial={{ feedstockId: preselected ? String(preselected.id) : '', startDate: utcDate(new Date()), checkInEveryDays: '7', species: 'eisenia-fetida' }}
      />
    </div>
  );
}
