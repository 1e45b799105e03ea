import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { ProposalForm } from '@/components/proposal/proposal-form';
import { getActor } from '@/lib/auth/actor';
import { getProposeContext } from '@/lib/queries/proposals';
import { can } from '@/lib/policies';

export const dynamic = 'force-dynamic';

type Params = { params: Promise<{ slug: string }> };

export async function generateMetadata({ params }: Params): Promise<Metadata> {
  const ctx = await getProposeContext((await params).slug);
  return { title: ctx ? `Propose a verdict: ${ctx.feedstock.name}` : 'Propose a verdict' };
}

export default async function ProposePage({ params }: Params) {
  const ctx = await getProposeContext((await params).slug);
  if (!ctx) notFound();
  const actor = await getActor();
  return (
    <div className="space-y-6">
      <header className="space-y-2">
        <p>
          <Link href={`/feedstocks/${ctx.feedstock.slug}`} className="underline underline-offset-4">
            ← {ctx.feedstock.name}
          </Link>
        </p>
        <h1 className="text-3xl">Propose a verdict for {ctx.feedstock.name}</h1>
        <p className="max-w-prose text-ink-muted">
          The form starts from the current evidence verdict. Other contributors vote on it, and a moderator decides with a written note; only then does the published verdict change.
        </p>
      </header>
      {can(actor, 'proposal.create') ? (
        <ProposalForm context={ctx} />
      ) : (
        <p className="rounded-md border border-line p-4">
          {actor ? 'Accept the contribution licence on your account page to propose verdicts.' : <><Link href="/signin" className="underline">Sign in</Link> as a contributor to propose a verdict.</>}
        </p>
      )}
    </div>
  );
}
