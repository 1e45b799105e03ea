'use client';

import { useState } from 'react';
import useSWR from 'swr';
import { Button } from '@/components/ui';
import type { ProposalDTO } from '@/lib/queries/proposals';
import { postJson } from './post-json';

const fetcher = (url: string) => fetch(url).then((r) => r.json());

/**
 * The live tally and, for people who may vote, the vote form. The tally comes
 * from the JSON API through SWR and updates after a vote without a reload.
 */
export function VotePanel({ initial, canVote, voteBlockedReason }: { initial: ProposalDTO; canVote: boolean; voteBlockedReason: string | null }) {
  const key = `/api/proposals/${initial.id}`;
  const { data, mutate } = useSWR<ProposalDTO>(key, fetcher, { fallbackData: initial, refreshInterval: 15_000 });
  const proposal = data ?? initial;
  const [reason, setReason] = useState(initial.myVote?.reason ?? '');
  const [message, setMessage] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  const t = proposal.tally;

  async function vote(agree: boolean) {
    setPending(true);
    setError(null);
    setMessage(null);
    // Optimistic: show the vote at once, then settle with the server's tally.
    const optimistic = { ...proposal, myVote: { agree, reason } };
    const r = await mutate(
      async () => {
        const res = await postJson<{ tally: ProposalDTO['tally'] }>(`${key}/votes`, { agree, reason });
        if (!res.ok) throw Object.assign(new Error(res.message), { fieldErrors: res.fieldErrors });
        return fetcher(key);
      },
      { optimisticData: optimistic, rollbackOnError: true, revalidate: false },
    ).catch((e: Error & { fieldErrors?: Record<string, string[]> }) => {
      setError(e.fieldErrors?.reason?.[0] ?? e.message);
      return null;
    });
    if (r) setMessage(agree ? 'Your vote: agree.' : 'Your vote: disagree.');
    setPending(false);
  }

  return (
    <section aria-labelledby="tally-heading" className="space-y-3 rounded-lg border border-line bg-surface-raised p-4">
      <h2 id="tally-heading" className="text-xl">Votes</h2>
      <p aria-live="polite" className="text-lg">
        <strong>{t.agree}</strong> agree · <strong>{t.disagree}</strong> disagree
        {t.ready ? <span className="ml-2 font-semibold text-accent-strong">Ready for a moderator</span> : <span className="ml-2 text-ink-muted">({t.missing})</span>}
      </p>
      <p className="text-sm text-ink-muted">Ready means at least 3 votes with two thirds agreeing. Votes never publish a verdict on their own: a moderator decides.</p>
      {proposal.status !== 'open' ? (
        <p>Voting closed: this proposal was {proposal.status}.</p>
      ) : canVote ? (
        <form onSubmit={(e) => e.preventDefault()} className="space-y-2">
          <label htmlFor="vote-reason" className="block font-semibold">
            Your reason <span className="font-normal text-ink-muted">(point at a trial if you can)</span>
          </label>
          <textarea
            id="vote-reason"
            value={reason}
            onChange={(e) => setReason(e.target.value)}
            rows={2}
            maxLength={500}
            aria-invalid={!!error}
            aria-describedby={error ? 'vote-error' : undefined}
            className="w-full rounded-md border border-line-strong bg-surface-raised p-2"
          />
          {error ? (
            <p id="vote-error" className="text-sm font-semibold text-danger">
              {error}
            </p>
          ) : null}
          <div className="flex flex-wrap gap-2">
            <Button onClick={() => vote(true)} disabled={pending} variant={proposal.myVote?.agree === true ? 'primary' : 'secondary'}>
              Agree
            </Button>
            <Button onClick={() => vote(false)} disabled={pending} variant={proposal.myVote?.agree === false ? 'primary' : 'secondary'}>
              Disagree
            </Button>
          </div>
          {proposal.myVote ? <p className="text-sm">You can change your vote until the proposal is decided.</p> : null}
          {message ? <p role="status">{message}</p> : null}
        </form>
      ) : voteBlockedReason ? (
        <p className="text-ink-muted">{voteBlockedReason}</p>
      ) : null}
    </section>
  );
}
