'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui';
import { postJson } from './post-json';

/** Moderator tools on a proposal: claim it, then approve or reject with a written note. */
export function DecisionPanel({ proposalId, claim }: { proposalId: number; claim: { by: string; until: string } | null }) {
  const router = useRouter();
  const [note, setNote] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [status, setStatus] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  async function send(url: string, body: unknown, done: string) {
    setPending(true);
    setError(null);
    const r = await postJson(url, body);
    setPending(false);
    if (!r.ok) {
      setError(r.fieldErrors.note?.[0] ?? r.message);
      return;
    }
    setStatus(done);
    router.refresh();
  }

  return (
    <section aria-labelledby="decision-heading" className="space-y-3 rounded-lg border border-line-strong bg-surface-raised p-4">
      <h2 id="decision-heading" className="text-xl">Decide</h2>
      {claim ? <p className="text-sm">Claimed by {claim.by} until {claim.until.slice(11, 16)} UTC.</p> : null}
      <Button variant="quiet" disabled={pending} onClick={() => send(`/api/proposals/${proposalId}/claim`, {}, 'Claimed for 30 minutes.')}>
        Claim for 30 minutes
      </Button>
      <label htmlFor="decision-note" className="block font-semibold">
        Note for the author and the history
      </label>
      <textarea
        id="decision-note"
        value={note}
        onChange={(e) => setNote(e.target.value)}
        rows={3}
        aria-invalid={!!error}
        aria-describedby={error ? 'decision-error' : undefined}
        className="w-full rounded-md border border-line-strong bg-surface-raised p-2"
      />
      {error ? (
        <p id="decision-error" role="alert" className="text-sm font-semibold text-danger">
          {error}
        </p>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <Button disabled={pending} onClick={() => send(`/api/proposals/${proposalId}/decision`, { decision: 'approve', note }, 'Approved and published.')}>
          Approve and publish
        </Button>
        <Button variant="danger" disabled={pending} onClick={() => send(`/api/proposals/${proposalId}/decision`, { decision: 'reject', note }, 'Rejected.')}>
          Reject
        </Button>
      </div>
      {status ? <p role="status">{status}</p> : null}
    </section>
  );
}
