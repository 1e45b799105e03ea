import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { VerdictBadge, type Verdict } from '@/components/evidence/verdict-badge';
import { SETTING_LABELS, type Setting } from '@/components/layout/vocabulary';
import { DecisionPanel } from '@/components/proposal/decision-panel';
import { HideButton } from '@/components/proposal/hide-button';
import { ResubmitButton } from '@/components/proposal/resubmit-button';
import { VotePanel } from '@/components/proposal/vote-panel';
import { Table } from '@/components/ui';
import { TrialsTable } from '@/components/feedstock/sections';
import { getActor } from '@/lib/auth/actor';
import { getProposal } from '@/lib/queries/proposals';
import { can, isTooNewToVote } from '@/lib/policies';

export const dynamic = 'force-dynamic';

type Params = { params: Promise<{ id: string }> };

export async function generateMetadata({ params }: Params): Promise<Metadata> {
  const id = Number((await params).id);
  return { title: `Proposal ${Number.isInteger(id) ? id : ''}`, description: 'A proposed change to a published verdict, its evidence and votes.' };
}

const fmt = (kg: number | null) => (kg === null ? 'no ceiling' : `${Math.round(kg * 10) / 10} kg/m²`);

export default async function ProposalPage({ params }: Params) {
  const id = Number((await params).id);
  if (!Number.isInteger(id) || id <= 0) notFound();
  const actor = await getActor();
  const p = await getProposal(id, actor);
  if (!p) notFound();
  const canVote = can(actor, 'proposal.vote', { authorId: p.authorId });
  const canDecide = can(actor, 'proposal.decide') && p.status === 'open';
  const canHide = can(actor, 'moderation.hide');
  let blocked: string | null = null;
  if (!actor) blocked = 'Sign in as a contributor to vote.';
  else if (actor.id === p.authorId) blocked = 'You wrote this proposal, so you cannot vote on it.';
  else if (actor.role === 'reader') blocked = 'Accept the contribution licence on your account page to vote.';
  else if (isTooNewToVote(actor)) blocked = 'New accounts can vote after their first day.';
  const current = new Map(p.current.map((c) => [c.setting, c]));

  return (
    <article className="space-y-8">
      <header className="space-y-2">
        <p className="text-ink-muted">
          <Link href={`/feedstocks/${p.feedstock.slug}`} className="underline underline-offset-4">
            {p.feedstock.name}
          </Link>{' '}
          · proposal {p.id} by {p.authorName} · {p.createdAt.slice(0, 10)}
        </p>
        <h1 className="text-3xl">Proposed verdict for {p.feedstock.name}</h1>
        <p>
          Status: <strong>{p.status}</strong>
          {p.hidden ? ' (hidden by a moderator)' : ''}
        </p>
        {p.stale ? (
          <p role="note" className="rounded-md border border-danger bg-surface-raised p-3">
            The published verdict changed after this proposal was made. Approval would be refused with a conflict; the author can resubmit it against the current verdict.
          </p>
        ) : null}
      </header>

      <section aria-labelledby="change-heading" className="space-y-3">
        <h2 id="change-heading" className="text-2xl">The change</h2>
        <Table caption="Published now and proposed, per setting">
          <thead>
            <tr>
              <th scope="col">Setting</th>
              <th scope="col">Published now</th>
              <th scope="col">Proposed</th>
              <th scope="col">Cautions</th>
            </tr>
          </thead>
          <tbody>
            {p.settings.map((s) => {
              const now = current.get(s.setting);
              return (
                <tr key={s.setting}>
                  <th scope="row">{SETTING_LABELS[s.setting as Setting]}</th>
                  <td>{now ? <><VerdictBadge verdict={now.verdict as Verdict} size="sm" /> <span className="text-sm">{fmt(now.ceilingKgM2)}</span></> : '—'}</td>
                  <td>
                    <VerdictBadge verdict={s.verdict} size="sm" /> <span className="text-sm">{fmt(s.ceilingKgM2)}</span>
                  </td>
                  <td>{s.cautions.length ? s.cautions.join(', ') : '—'}</td>
                </tr>
              );
            })}
          </tbody>
        </Table>
        <h3 className="text-xl">Rationale</h3>
        <p className="max-w-prose whitespace-pre-line">{p.rationale}</p>
      </section>

      <section aria-labelledby="trials-heading" className="space-y-3">
        <h2 id="trials-heading" className="text-2xl">Cited trials ({p.trials.length})</h2>
        {p.trials.length ? (
          <TrialsTable trials={p.trials} name={p.feedstock.name} caption="Trials this proposal rests on" />
        ) : (
          <p>No trials cited.</p>
        )}
      </section>

      <VotePanel initial={p} canVote={canVote && p.status === 'open'} voteBlockedReason={blocked} />

      {p.votes.length ? (
        <section aria-labelledby="reasons-heading" className="space-y-2">
          <h2 id="reasons-heading" className="text-2xl">Reasons given</h2>
          <ul className="space-y-2">
            {p.votes.map((v) => (
              <li key={v.id} className="rounded-md border border-line p-3">
                <strong>{v.agree ? 'Agrees' : 'Disagrees'}</strong> — {v.voterName}: {v.reason}
                {v.hidden ? <em className="ml-2 text-ink-muted">(hidden)</em> : null}
                {canHide ? <HideButton url={`/api/votes/${v.id}/visibility`} hidden={v.hidden} what="vote" /> : null}
              </li>
            ))}
          </ul>
        </section>
      ) : null}

      {p.decision ? (
        <section aria-labelledby="decided-heading" className="space-y-1">
          <h2 id="decided-heading" className="text-2xl">Decision</h2>
          <p>
            {p.status === 'approved' ? 'Approved' : 'Rejected'} by {p.decision.by ?? 'a moderator'} on {p.decision.at.slice(0, 10)}.
          </p>
          {p.decision.note ? <p className="max-w-prose whitespace-pre-line">{p.decision.note}</p> : null}
        </section>
      ) : null}

      {actor?.id === p.authorId && (p.status === 'rejected' || p.stale) ? <ResubmitButton proposalId={p.id} /> : null}
      {canDecide ? <DecisionPanel proposalId={p.id} claim={p.claim} /> : null}
      {canHide ? <HideButton url={`/api/proposals/${p.id}/visibility`} hidden={p.hidden} what="proposal" /> : null}
    </article>
  );
}
