import Link from 'next/link';
import { CertaintyBadge, VerdictBadge, VERDICT_LABELS } from '@/components/evidence/verdict-badge';
import { SETTING_DESCRIPTIONS, SETTING_LABELS } from '@/components/layout/vocabulary';
import { formatDate } from '@/lib/format';
import type { SettingSectionDTO } from '@/lib/queries/feedstocks';
import { Load, ReaderUnitsText } from './load';
import { cautionLabel, PREPARATION_LABELS } from './vocabulary';

/** The published verdict for one setting, with its ceiling and cautions: the answer a reader came for. */
export function PublishedVerdictCard({ section }: { section: SettingSectionDTO }) {
  const p = section.published;
  const headingId = `verdict-${section.setting}`;
  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-3 rounded-lg border border-line bg-surface-raised p-4">
      <h3 id={headingId} className="text-lg">
        {SETTING_LABELS[section.setting]}
      </h3>
      {p ? (
        <>
          <VerdictBadge verdict={p.verdict} size="lg" className="self-start" />
          <dl className="space-y-1">
            <div>
              <dt className="inline font-semibold">Dose ceiling: </dt>
              <dd className="inline">
                {p.ceilingKgM2 !== null ? (
                  <>
                    <Load kgM2={p.ceilingKgM2} /> <span className="text-ink-muted">per feeding</span>
                  </>
                ) : p.verdict === 'feed' ? (
                  'none needed at ordinary doses'
                ) : (
                  'not set'
                )}
              </dd>
            </div>
            {p.cautions.length ? (
              <div>
                <dt className="font-semibold">Watch for:</dt>
                <dd>
                  <ul className="list-disc pl-5">
                    {p.cautions.map((c) => (
                      <li key={c}>{cautionLabel(c)}</li>
                    ))}
                  </ul>
                </dd>
              </div>
            ) : null}
          </dl>
          <p className="text-sm text-ink-muted">
            Published {formatDate(p.publishedAt)}
            {p.proposalId ? (
              <>
                {' '}
                after <Link href={`/proposals/${p.proposalId}`}>proposal {p.proposalId}</Link>
              </>
            ) : null}
            .
          </p>
        </>
      ) : (
        <p>
          No published verdict for this setting yet.{' '}
          {section.evidence ? `The evidence so far reads ${VERDICT_LABELS[section.evidence.verdict]}.` : null}
        </p>
      )}
      <p className="text-sm text-ink-muted">{SETTING_DESCRIPTIONS[section.setting]}</p>
    </section>
  );
}

/** The evidence verdict for one setting and how the engine reached it, in plain words. */
export function EvidenceDerivation({ section }: { section: SettingSectionDTO }) {
  const e = section.evidence;
  const headingId = `evidence-${section.setting}`;
  if (!e) return null;
  return (
    <section aria-labelledby={headingId} className="space-y-3 rounded-lg border border-line bg-surface-raised p-4">
      <h3 id={headingId} className="text-lg">
        {SETTING_LABELS[section.setting]}: what the trials say
      </h3>
      {section.disagree && section.published ? (
        <p role="note" className="rounded-md border-2 border-verdict-limit bg-verdict-limit-soft p-3 text-ink">
          <strong>The evidence and the published verdict disagree.</strong> Published: {VERDICT_LABELS[section.published.verdict]}; the trials now
          read {VERDICT_LABELS[e.verdict]}. The published verdict changes only when a moderator decides a proposal, so this feedstock is in the
          review queue.
        </p>
      ) : null}
      <div className="flex flex-wrap items-center gap-2">
        <span className="font-semibold">Evidence verdict:</span>
        <VerdictBadge verdict={e.verdict} size="sm" />
        <CertaintyBadge grade={e.certainty} size="sm" />
      </div>
      <p>
        {e.trialCount} {e.trialCount === 1 ? 'trial' : 'trials'}, {e.finishedCount} with an outcome.
        {e.ceilingKgM2 !== null ? (
          <>
            {' '}
            Dose ceiling from the trials: <Load kgM2={e.ceilingKgM2} />
            {e.ceilingPreparation ? ` (${(PREPARATION_LABELS[e.ceilingPreparation] ?? e.ceilingPreparation).toLowerCase()})` : ''}.
          </>
        ) : null}
      </p>
      <ul className="list-disc space-y-1 pl-5">
        {/* The certainty sentence is shown below, broken down by reason. */}
        {e.sentences
          .filter((s) => !(e.certaintyReasons.length && s.startsWith('Certainty ')))
          .map((s, i) => (
            <li key={i}>
              <ReaderUnitsText text={s} />
            </li>
          ))}
      </ul>
      {e.certaintyReasons.length ? (
        <div>
          <p className="font-semibold">Why the certainty is {e.certainty}</p>
          {e.certaintyBase ? <p className="text-ink-muted">It {e.certaintyBase}.</p> : null}
          <ul className="list-disc pl-5">
            {e.certaintyReasons.map((r) => (
              <li key={r.domain}>
                <span className="font-semibold">{r.domain.charAt(0).toUpperCase() + r.domain.slice(1)}</span>: {r.reasons.join('; ')}
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      <p className="text-sm text-ink-muted">Worked out {formatDate(e.computedAt)} from every trial logged for this setting.</p>
    </section>
  );
}
