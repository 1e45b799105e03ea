import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { SETTING_LABELS } from '@/components/layout/vocabulary';
import { CheckInForm } from '@/components/trial/check-in-form';
import { CheckInList } from '@/components/trial/check-in-list';
import { CloseTrialForm } from '@/components/trial/close-trial-form';
import { MarkdownNotes } from '@/components/trial/markdown-notes';
import { OutcomeBadge, StatusBadge } from '@/components/trial/outcome-badge';
import { PhotoGallery } from '@/components/trial/photo-gallery';
import { PhotoUploader } from '@/components/trial/photo-uploader';
import { TimelineChart, type TimelineSeries } from '@/components/trial/timeline-chart';
import {
  formatDay,
  formatDose,
  formatNumber,
  OUTCOME_DESCRIPTIONS,
  OUTCOME_LABELS,
  PREPARATION_LABELS,
  PROVENANCE_LABELS,
  SPECIES_LABELS,
} from '@/components/trial/vocabulary';
import { Card } from '@/components/ui/card';
import { LinkButton } from '@/components/ui/link-button';
import { getActor } from '@/lib/auth/actor';
import { parseId } from '@/lib/http/respond';
import { getTrialDetail, type TrialDetail, type TrialSummaryDto } from '@/lib/queries/trials';
import { contributorName } from '@/lib/trials/contributor';
import { utcDate } from '@/lib/trials/schedule';
import { addCheckInAction, closeTrialAction } from '../actions';

export const dynamic = 'force-dynamic';

type Props = { params: Promise<{ id: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const id = parseId((await params).id);
  const t = id ? await getTrialDetail(id) : null;
  return t ? { title: `Trial ${t.id}: ${t.feedstock.name}`, description: `A feeding trial of ${t.feedstock.name.toLowerCase()}, ${PREPARATION_LABELS[t.preparation].toLowerCase()}, in an ${SETTING_LABELS[t.setting].toLowerCase()}.` } : { title: 'Trial not found' };
}

function Row({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <>
      <dt className="text-ink-muted">{label}</dt>
      <dd className="m-0">{children}</dd>
    </>
  );
}

/** The side-by-side comparison of a trial and its paired trial. */
function PairCompare({ a, b }: { a: TrialSummaryDto; b: TrialSummaryDto }) {
  const col = (t: TrialSummaryDto, title: string) => (
    <Card as="section" aria-labelledby={`pair-${t.id}`}>
      <h3 id={`pair-${t.id}`} className="text-lg">
        {title}: {t.id === a.id ? `trial ${t.id}` : <Link href={`/trials/${t.id}`}>trial {t.id}</Link>}
        {t.isControl ? <span className="ml-2 text-sm font-normal text-ink-muted">(control)</span> : null}
      </h3>
      <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1">
        <Row label="Preparation">{PREPARATION_LABELS[t.preparation]}</Row>
        <Row label="Source">{PROVENANCE_LABELS[t.provenance]}</Row>
        <Row label="Setting">{SETTING_LABELS[t.setting]}</Row>
        <Row label="Dose">{formatDose(t.dose.amount, t.dose.unit)}</Row>
        <Row label="Load">{formatNumber(t.surfaceLoadKgM2)} kg/m²</Row>
        <Row label="Started">{formatDay(t.startDate)}</Row>
        <Row label="Check-ins">{t.checkInCount}</Row>
        <Row label="Status">
          <StatusBadge status={t.status} />
        </Row>
        <Row label="Outcome">
          <OutcomeBadge outcome={t.outcome} />
        </Row>
      </dl>
    </Card>
  );
  return (
    <div className="grid gap-4 md:grid-cols-2">
      {col(a, 'This plot')}
      {col(b, 'Paired plot')}
    </div>
  );
}

function OutcomeSection({ t }: { t: TrialDetail }) {
  const derived = t.derived;
  return (
    <section aria-labelledby="outcome-heading" className="space-y-3">
      <h2 id="outcome-heading" className="text-2xl">
        Outcome
      </h2>
      <div className="grid gap-4 md:grid-cols-2">
        <Card>
          <h3 className="text-lg">What the check-ins show</h3>
          <p className="mt-2">
            <OutcomeBadge outcome={derived.outcome} />
          </p>
          <ul className="mt-2 list-disc space-y-1 pl-5 text-sm">
            {derived.reasons.map((r) => (
              <li key={r}>{r[0].toUpperCase() + r.slice(1)}.</li>
            ))}
          </ul>
          {derived.adverseEvents.length ? (
            <p className="mt-2 text-sm">
              <span className="font-semibold">Watch-outs seen: </span>
              {derived.adverseEvents.map((e) => `${e.words} (from day ${e.firstDay})`).join('; ')}.
            </p>
          ) : null}
          {derived.harmless.length ? <p className="mt-1 text-sm text-ink-muted">Springtails seen: harmless decomposers.</p> : null}
        </Card>
        <Card>
          <h3 className="text-lg">Confirmed by the keeper</h3>
          {t.status === 'closed' ? (
            <>
              <p className="mt-2">
                <OutcomeBadge outcome={t.confirmedOutcome} />
              </p>
              {t.confirmedOutcome ? <p className="mt-2 text-sm">{OUTCOME_DESCRIPTIONS[t.confirmedOutcome]}</p> : null}
              {t.proposedIfClosed && t.confirmedOutcome && t.proposedIfClosed !== t.confirmedOutcome ? (
                <p className="mt-2 text-sm">
                  Corrected from the outcome the check-ins gave ({OUTCOME_LABELS[t.proposedIfClosed].toLowerCase()}){t.closeReason ? ': ' : '.'}
                  {t.closeReason ? <q>{t.closeReason}</q> : null}
                </p>
              ) : t.closeReason ? (
                <p className="mt-2 text-sm">
                  Note: <q>{t.closeReason}</q>
                </p>
              ) : null}
            </>
          ) : t.status === 'abandoned' ? (
            <p className="mt-2">Abandoned{t.closeReason ? <>: <q>{t.closeReason}</q></> : '.'} It counts as an open (censored) trial.</p>
          ) : (
            <p className="mt-2 text-ink-muted">Not yet: the keeper confirms the outcome when closing the trial.</p>
          )}
        </Card>
      </div>
    </section>
  );
}

export default async function TrialPage({ params }: Props) {
  const id = parseId((await params).id);
  const actor = await getActor();
  const t = id ? await getTrialDetail(id, actor) : null;
  if (!t) notFound();

  const series: TimelineSeries[] = [{ label: `Trial ${t.id}`, points: t.timeline, variant: 'main' }];
  if (t.paired) series.push({ label: `Paired trial ${t.paired.id}`, points: t.paired.timeline, variant: 'paired' });
  const today = utcDate(new Date());

  return (
    <article className="space-y-10" aria-labelledby="trial-heading">
      <header className="space-y-3">
        <p className="text-sm">
          <Link href="/trials">Trials</Link> <span aria-hidden="true">›</span> Trial {t.id}
        </p>
        <h1 id="trial-heading" className="text-3xl">
          Trial {t.id}: {t.feedstock.name}, {PREPARATION_LABELS[t.preparation].toLowerCase()}
        </h1>
        <p className="flex flex-wrap items-center gap-2">
          <StatusBadge status={t.status} />
          <OutcomeBadge outcome={t.outcome} />
          {t.isDemo ? <span className="rounded-md bg-straw px-2 py-0.5 text-sm font-semibold">Demo trial (invented)</span> : null}
        </p>
        <p className="text-ink-muted">
          {SETTING_LABELS[t.setting]} · {t.region} · started {formatDay(t.startDate)} · by {contributorName(t.contributor)}
        </p>
        <p>
          Evidence for this feedstock: <Link href={`/feedstocks/${t.feedstock.slug}`}>{t.feedstock.name}</Link>
        </p>
        {t.abilities.canEdit ? (
          <p>
            <LinkButton href={`/trials/${t.id}/edit`} variant="secondary">
              Edit details
            </LinkButton>
          </p>
        ) : null}
      </header>

      <section aria-labelledby="setup-heading" className="space-y-3">
        <h2 id="setup-heading" className="text-2xl">
          Set-up
        </h2>
        <dl className="grid grid-cols-[auto_1fr] gap-x-6 gap-y-1 lg:grid-cols-[auto_1fr_auto_1fr]">
          <Row label="Dose">
            {formatDose(t.dose.amount, t.dose.unit)}
            {t.dose.unit !== 'kg' ? ` (${formatNumber(t.doseKg, 3)} kg)` : ''}
          </Row>
          <Row label="Surface load">{formatNumber(t.surfaceLoadKgM2)} kg/m²</Row>
          <Row label="Area">{formatNumber(t.surfaceAreaM2, 3)} m²</Row>
          <Row label="Layer depth">{t.layerDepthCm !== null ? `${formatNumber(t.layerDepthCm, 1)} cm` : 'not given'}</Row>
          <Row label="Bed depth">{t.bedDepthCm !== null ? `${formatNumber(t.bedDepthCm, 1)} cm` : 'not given'}</Row>
          <Row label="Worms">{SPECIES_LABELS[t.species]}</Row>
          <Row label="Worm mass">{t.wormMassKg !== null ? `${formatNumber(t.wormMassKg, 3)} kg` : 'not given'}</Row>
          <Row label="Feed ratio">{t.feedRatio !== null ? `${formatNumber(t.feedRatio)} kg per kg of worms` : '—'}</Row>
          <Row label="Source">{PROVENANCE_LABELS[t.provenance]}</Row>
          <Row label="Check-ins">
            every {t.checkInEveryDays} day{t.checkInEveryDays === 1 ? '' : 's'}
            {t.nextCheckInDue ? `; next due ${formatDay(t.nextCheckInDue)}` : ''}
          </Row>
          <Row label="Photos">{t.photoCount}</Row>
          <Row label="Control plot">{t.isControl ? 'yes, this is the control' : t.paired ? 'paired (see below)' : 'none'}</Row>
        </dl>
        <MarkdownNotes source={t.notes} />
      </section>

      <OutcomeSection t={t} />

      <section aria-labelledby="timeline-heading" className="space-y-3">
        <h2 id="timeline-heading" className="text-2xl">
          Timeline
        </h2>
        {t.timeline.length || t.paired?.timeline.length ? <TimelineChart series={series} /> : <p className="text-ink-muted">The chart appears after the first check-in.</p>}
      </section>

      {t.paired ? (
        <section aria-labelledby="pair-heading" className="space-y-3">
          <h2 id="pair-heading" className="text-2xl">
            Side by side with the paired trial
          </h2>
          <PairCompare a={t} b={t.paired} />
        </section>
      ) : null}

      <section aria-labelledby="check-ins-heading" className="space-y-3">
        <h2 id="check-ins-heading" className="text-2xl">
          Check-ins
        </h2>
        <CheckInList checkIns={t.checkIns} />
      </section>

      {t.photos.length || t.abilities.canUpload ? (
        <section aria-labelledby="photos-heading" className="space-y-3">
          <h2 id="photos-heading" className="text-2xl">
            Photos of the trial
          </h2>
          <PhotoGallery photos={t.photos} label={`Photos of trial ${t.id}`} />
          {t.abilities.canUpload ? <PhotoUploader trialId={t.id} /> : null}
        </section>
      ) : null}

      {t.abilities.canCheckIn ? (
        <section aria-labelledby="add-check-in-heading" className="space-y-3">
          <h2 id="add-check-in-heading" className="text-2xl">
            Add a check-in
          </h2>
          <Card className="max-w-3xl">
            <CheckInForm trialId={t.id} startDate={t.startDate} today={today < t.startDate ? t.startDate : today} action={addCheckInAction} />
          </Card>
        </section>
      ) : null}

      {t.abilities.canClose ? (
        <section aria-labelledby="close-heading" className="space-y-3">
          <h2 id="close-heading" className="text-2xl">
            Close this trial
          </h2>
          <Card className="max-w-3xl">
            <CloseTrialForm trialId={t.id} proposed={t.proposedIfClosed} action={closeTrialAction} />
          </Card>
        </section>
      ) : null}
    </article>
  );
}
