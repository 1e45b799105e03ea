import Link from 'next/link';
import { VerdictBadge } from '@/components/evidence/verdict-badge';
import { SETTING_LABELS } from '@/components/layout/vocabulary';
import type { listOpenProposals, listVerdictHistory } from '@/lib/queries/proposals';

type History = Awaited<ReturnType<typeof listVerdictHistory>>;
type Open = Awaited<ReturnType<typeof listOpenProposals>>;

/**
 * The published-verdict side of a feedstock page: open proposals with their
 * tallies, a way to propose a change, and the verdict history (who, when,
 * which proposal, the note).
 */
export function VerdictHistorySection({ slug, history, open }: { slug: string; history: History; open: Open }) {
  return (
    <section id="verdict-history" aria-labelledby="verdict-history-heading" className="space-y-4">
      <h2 id="verdict-history-heading" className="text-2xl">
        Proposals and verdict history
      </h2>
      {open.length ? (
        <ul className="m-0 list-none space-y-2 p-0">
          {open.map((p) => (
            <li key={p.id} className="rounded-md border border-line bg-surface-raised p-3">
              <Link href={`/proposals/${p.id}`} className="font-semibold">
                Proposal {p.id}
              </Link>
              : {p.settings.map((s) => `${SETTING_LABELS[s.setting]} → `).join('')}
              {p.settings.map((s) => (
                <VerdictBadge key={s.setting} verdict={s.verdict} size="sm" className="ml-1" />
              ))}{' '}
              <span className="text-sm text-ink-muted">
                {p.tally.agree} agree, {p.tally.disagree} disagree{p.tally.ready ? ' — ready for a moderator' : ''}
              </span>
            </li>
          ))}
        </ul>
      ) : (
        <p className="m-0">No open proposals.</p>
      )}
      <p className="m-0">
        <Link href={`/feedstocks/${slug}/propose`} className="font-semibold">
          Propose a change to the published verdict
        </Link>{' '}
        <span className="text-ink-muted">(contributors propose and vote; a moderator decides)</span>
      </p>
      {history.length ? (
        <ol className="m-0 list-none space-y-2 p-0">
          {history.map((h) => (
            <li key={h.id} className="border-l-4 border-line-strong pl-3">
              <p className="m-0">
                <time dateTime={h.decidedAt}>{h.decidedAt.slice(0, 10)}</time> · {SETTING_LABELS[h.setting]}:{' '}
                {h.previousVerdict ? (
                  <>
                    <VerdictBadge verdict={h.previousVerdict} size="sm" /> →{' '}
                  </>
                ) : null}
                <VerdictBadge verdict={h.verdict} size="sm" />
                {h.ceilingKgM2 !== null ? <span className="text-sm"> (ceiling {Math.round(h.ceilingKgM2 * 100) / 100} kg/m²)</span> : null}
              </p>
              <p className="m-0 text-sm text-ink-muted">
                {h.decidedBy ? `Decided by ${h.decidedBy}` : 'Decided'}
                {h.proposalId ? (
                  <>
                    {' '}after <Link href={`/proposals/${h.proposalId}`}>proposal {h.proposalId}</Link>
                  </>
                ) : null}
                .
              </p>
              <p className="m-0 text-sm">{h.note}</p>
            </li>
          ))}
        </ol>
      ) : null}
    </section>
  );
}
