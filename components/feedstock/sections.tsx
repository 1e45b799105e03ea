import Link from 'next/link';
import { VerdictBadge, VERDICT_LABELS } from '@/components/evidence/verdict-badge';
import { DEFER_TO_LOCAL_RULES } from '@/components/layout/safety-note';
import { SETTING_LABELS } from '@/components/layout/vocabulary';
import { Table } from '@/components/ui/table';
import { formatNumber } from '@/lib/format';
import type { FeedstockPageDTO, RelatedFeedstockDTO, SettingSectionDTO, TrialTableRow } from '@/lib/queries/feedstocks';
import { medianWords, OutcomeChart, OutcomeLegend, SurvivalChart } from './charts';
import { ForEachUnits, Load, ReaderUnitsText } from './load';
import {
  HANDLING_ADVICE,
  OUTCOME_LABELS,
  PREPARATION_LABELS,
  TRIAL_STATUS_LABELS,
  type HandlingCautionCode,
  type OutcomeCode,
} from './vocabulary';

/** Handling cautions for people (manure, mould, dust, shredders, pathogens, rodents), deferring to local rules. */
export function HandlingCautions({ codes }: { codes: HandlingCautionCode[] }) {
  if (!codes.length) return null;
  return (
    <section aria-labelledby="handling-heading" className="space-y-3 rounded-lg border-2 border-verdict-avoid/50 bg-surface-raised p-4">
      <h2 id="handling-heading" className="text-2xl">
        Handling it safely
      </h2>
      <div className="grid gap-4 md:grid-cols-2">
        {codes.map((c) => (
          <div key={c}>
            <h3 className="text-lg">{HANDLING_ADVICE[c].title}</h3>
            <ul className="mt-1 list-disc space-y-1 pl-5">
              {HANDLING_ADVICE[c].points.map((p) => (
                <li key={p}>{p}</li>
              ))}
            </ul>
          </div>
        ))}
      </div>
      <p className="font-semibold">{DEFER_TO_LOCAL_RULES}</p>
      <p className="text-sm">
        More in the guide <Link href="/guides/handling-safely">Handling compost, manures and shredders safely</Link>.
      </p>
    </section>
  );
}

/** The engine's caution sentences per setting ("heating in 3 of 5 trials, all above 6 kg/m²"). */
export function EvidenceCautions({ settings }: { settings: SettingSectionDTO[] }) {
  const withCautions = settings.filter((s) => s.cautions.length);
  if (!withCautions.length) return <p>No trial has recorded a problem so far.</p>;
  return (
    <div className="space-y-3">
      {withCautions.map((s) => (
        <div key={s.setting}>
          <h3 className="text-lg">{SETTING_LABELS[s.setting]}</h3>
          <ul className="mt-1 list-disc space-y-1 pl-5">
            {s.cautions.map((c, i) => (
              <li key={i}>
                <span className="text-ink-muted">{PREPARATION_LABELS[c.preparation] ?? c.preparation}:</span> <ReaderUnitsText text={c.text} />
              </li>
            ))}
          </ul>
        </div>
      ))}
    </div>
  );
}

/** How each preparation fared, per setting: the preparation advice the trials give. */
export function PreparationAdvice({ settings }: { settings: SettingSectionDTO[] }) {
  const rows = settings.flatMap((s) => s.preparations.map((p) => ({ setting: s.setting, ...p })));
  if (!rows.length) return <p>No trials yet, so nothing to compare. The page text below has keepers&rsquo; advice.</p>;
  return (
    <Table caption="How each preparation fared in trials">
      <thead>
        <tr>
          <th scope="col">Setting</th>
          <th scope="col">Preparation</th>
          <th scope="col">What the trials say</th>
          <th scope="col">Consumed</th>
          <th scope="col">Ceiling</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={`${r.setting}-${r.preparation}`}>
            <td>{SETTING_LABELS[r.setting]}</td>
            <th scope="row" className="border-t border-line font-normal">
              {PREPARATION_LABELS[r.preparation] ?? r.preparation}
            </th>
            <td>
              {r.settled ? (
                <VerdictBadge verdict={r.verdict} size="sm" />
              ) : r.provisionalVerdict ? (
                <span>
                  leaning {VERDICT_LABELS[r.provisionalVerdict]} <span className="text-ink-muted">(not yet settled)</span>
                </span>
              ) : (
                <span className="text-ink-muted">no finished trials</span>
              )}
            </td>
            <td>
              {r.successShare !== null ? `${Math.round(r.successShare * 100)}% of ${r.finishedCount}` : '—'}
              <span className="text-ink-muted"> ({r.trialCount} logged)</span>
            </td>
            <td>{r.ceilingKgM2 !== null ? <Load kgM2={r.ceilingKgM2} /> : '—'}</td>
          </tr>
        ))}
      </tbody>
    </Table>
  );
}

/** The linked trials: setting, preparation, load, status, outcome, region only. */
export function TrialsTable({ trials, name, caption }: { trials: TrialTableRow[]; name: string; caption?: string }) {
  if (!trials.length) {
    return (
      <p>
        No trials of {name.toLowerCase()} yet. <Link href="/guides/running-a-feeding-trial">How to run one</Link>.
      </p>
    );
  }
  return (
    <Table caption={caption ?? `${trials.length} ${trials.length === 1 ? 'trial' : 'trials'} of ${name.toLowerCase()}`}>
      <thead>
        <tr>
          <th scope="col">Trial</th>
          <th scope="col">Setting</th>
          <th scope="col">Preparation</th>
          <th scope="col">Load</th>
          <th scope="col">Status</th>
          <th scope="col">Outcome</th>
          <th scope="col">Region</th>
        </tr>
      </thead>
      <tbody>
        {trials.map((t) => (
          <tr key={t.id}>
            <th scope="row" className="border-t border-line font-normal">
              <Link href={`/trials/${t.id}`}>#{t.id}</Link>
            </th>
            <td>{SETTING_LABELS[t.setting]}</td>
            <td>{PREPARATION_LABELS[t.preparation] ?? t.preparation}</td>
            <td className="whitespace-nowrap"><Load kgM2={t.surfaceLoadKgM2} /></td>
            <td>{TRIAL_STATUS_LABELS[t.status] ?? t.status}</td>
            <td>{t.outcome ? OUTCOME_LABELS[t.outcome as OutcomeCode] : <span className="text-ink-muted">—</span>}</td>
            <td>{t.region}</td>
          </tr>
        ))}
      </tbody>
    </Table>
  );
}

/** One outcome-against-load chart per setting, on a shared scale. */
export function OutcomeCharts({ page }: { page: FeedstockPageDTO }) {
  if (!page.trials.length) return null;
  const loads = page.trials.map((t) => t.surfaceLoadKgM2).filter((x) => x > 0);
  const ceilings = page.settings.map((s) => s.published?.ceilingKgM2).filter((x): x is number => typeof x === 'number' && x > 0);
  const all = [...loads, ...ceilings];
  const domain: [number, number] = [Math.min(...all) / 1.5, Math.max(...all) * 1.5];
  const bySetting = (['bin', 'flow-through', 'bed'] as const).filter((s) => page.trials.some((t) => t.setting === s));
  return (
    <div className="space-y-6">
      <OutcomeLegend />
      {bySetting.map((s) => (
        <div key={s} className="space-y-1">
          <h3 className="text-lg">{SETTING_LABELS[s]}</h3>
          <ForEachUnits
            render={(units) => (
              <OutcomeChart
                title={`Outcome against surface load, ${SETTING_LABELS[s].toLowerCase()}`}
                points={page.trials
                  .filter((t) => t.setting === s)
                  .map((t) => ({ id: t.id, preparation: t.preparation, loadKgM2: t.surfaceLoadKgM2, outcome: t.outcome, status: t.status }))}
                units={units}
                ceilingKgM2={page.settings.find((x) => x.setting === s)?.published?.ceilingKgM2 ?? null}
                domainKgM2={domain}
              />
            )}
          />
        </div>
      ))}
      <p className="text-sm text-ink-muted">Every trial in these charts is also listed in the table above.</p>
    </div>
  );
}

/** Kaplan–Meier curves per setting, each with its numbers in a table. */
export function SurvivalCharts({ settings }: { settings: SettingSectionDTO[] }) {
  const withCurves = settings.filter((s) => s.survival.length);
  if (!withCurves.length) return <p>No trial has check-ins yet, so there is no curve to draw.</p>;
  return (
    <div className="space-y-8">
      {withCurves.map((s) => (
        <div key={s.setting} className="space-y-2">
          <h3 className="text-lg">{SETTING_LABELS[s.setting]}</h3>
          <ul className="list-disc pl-5">
            {s.survival.map((c) => (
              <li key={c.preparation}>
                {PREPARATION_LABELS[c.preparation] ?? c.preparation}: median time to consumption {medianWords(c)}.
              </li>
            ))}
          </ul>
          <SurvivalChart title={`Time to consumption, ${SETTING_LABELS[s.setting].toLowerCase()}`} curves={s.survival} />
          <details className="rounded-md border border-line bg-surface-raised p-3">
            <summary className="cursor-pointer font-semibold">The numbers behind the curve</summary>
            <div className="mt-3 space-y-4">
              {s.survival.map((c) => (
                <Table key={c.preparation} caption={`${PREPARATION_LABELS[c.preparation] ?? c.preparation}: Kaplan–Meier table`}>
                  <thead>
                    <tr>
                      <th scope="col">Day</th>
                      <th scope="col">Trials still with feed</th>
                      <th scope="col">Consumed that day</th>
                      <th scope="col">Censored</th>
                      <th scope="col">Share with feed left</th>
                    </tr>
                  </thead>
                  <tbody>
                    {c.table.map((r) => (
                      <tr key={r.time}>
                        <th scope="row" className="border-t border-line font-normal">
                          {formatNumber(r.time, 3)}
                        </th>
                        <td>{r.atRisk}</td>
                        <td>{r.events}</td>
                        <td>{r.censored}</td>
                        <td>{Math.round(r.survival * 1000) / 10}%</td>
                      </tr>
                    ))}
                  </tbody>
                </Table>
              ))}
            </div>
          </details>
        </div>
      ))}
    </div>
  );
}

/** Feedstocks of the same family, with their published verdicts. */
export function RelatedFeedstocks({ related, family }: { related: RelatedFeedstockDTO[]; family: string | null }) {
  if (!related.length) return null;
  return (
    <section aria-labelledby="related-heading" className="space-y-3">
      <h2 id="related-heading" className="text-2xl">
        Related feedstocks{family ? <span className="font-sans text-lg font-normal text-ink-muted"> ({family} family)</span> : null}
      </h2>
      <ul className="grid list-none gap-2 p-0 sm:grid-cols-2">
        {related.map((r) => (
          <li key={r.slug} className="rounded-lg border border-line bg-surface-raised p-3">
            <Link href={`/feedstocks/${r.slug}`} className="font-semibold">
              {r.name}
            </Link>
            <span className="mt-1 flex flex-wrap gap-1">
              {(['bin', 'flow-through', 'bed'] as const)
                .filter((s) => r.published[s])
                .map((s) => (
                  <span key={s} className="inline-flex items-center gap-1 text-sm">
                    <span className="text-ink-muted">{SETTING_LABELS[s]}:</span>
                    <VerdictBadge verdict={r.published[s]!} size="sm" />
                  </span>
                ))}
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
}
