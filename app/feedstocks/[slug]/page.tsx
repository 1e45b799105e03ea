import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound, permanentRedirect } from 'next/navigation';
import { cache } from 'react';
import { VERDICT_LABELS } from '@/components/evidence/verdict-badge';
import { SETTING_LABELS } from '@/components/layout/vocabulary';
import { EvidenceDerivation, PublishedVerdictCard } from '@/components/feedstock/setting-verdict';
import {
  EvidenceCautions,
  HandlingCautions,
  OutcomeCharts,
  PreparationAdvice,
  RelatedFeedstocks,
  SurvivalCharts,
  TrialsTable,
} from '@/components/feedstock/sections';
import { UnitsToggle } from '@/components/feedstock/units-toggle';
import { PageText } from '@/components/markdown/page-text';
import { SubscribePanel } from '@/components/subscription/subscribe-panel';
import { VerdictHistorySection } from '@/components/proposal/verdict-history';
import { listOpenProposals, listVerdictHistory } from '@/lib/queries/proposals';
import { formatDate, formatNumber } from '@/lib/format';
import { getFeedstockPageCached } from '@/lib/queries/cached';
import { resolveFeedstockSlug } from '@/lib/queries/feedstocks';
import { CATEGORY_LABELS } from '@/lib/vocabulary';

type Props = { params: Promise<{ slug: string }> };

/*
 * The page is the same for every reader (units switch in the browser, the
 * account links and the follow panel are client leaves), so Next.js renders it
 * on first request and serves it from the page cache after that. Writers drop
 * it at once (lib/http/revalidate.ts, the feedstock actions); writes made
 * outside the app show within a minute.
 */
export const revalidate = 60;

/** No page is rendered at build time; each is rendered on first request, then cached. */
export function generateStaticParams(): { slug: string }[] {
  return [];
}

/**
 * Resolves the slug; an old or merged address answers 308 to the current one.
 * Wrapped in React's `cache` so metadata and page share one lookup per request.
 */
const load = cache(async (slug: string) => {
  const resolved = await resolveFeedstockSlug(slug);
  if (resolved.kind === 'redirect') permanentRedirect(`/feedstocks/${resolved.slug}`);
  if (resolved.kind === 'missing') notFound();
  const page = await getFeedstockPageCached(resolved.id, resolved.stamp);
  if (!page) notFound();
  return page;
});

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { slug } = await params;
  const page = await load(slug);
  const verdicts = page.settings
    .filter((s) => s.published)
    .map((s) => `${SETTING_LABELS[s.setting]}: ${VERDICT_LABELS[s.published!.verdict]}`)
    .join('; ');
  const description = [`Can worms eat ${page.name.toLowerCase()}?`, verdicts ? `${verdicts}.` : '', page.summary].filter(Boolean).join(' ');
  return {
    title: `${page.name}: can worms eat it?`,
    description,
    alternates: {
      canonical: `/feedstocks/${page.slug}`,
      types: { 'application/atom+xml': [{ url: `/feedstocks/${page.slug}/feed.xml`, title: `${page.name} — updates` }] },
    },
    openGraph: { title: `${page.name} — Trialbed`, description, type: 'article', url: `/feedstocks/${page.slug}`, siteName: 'Trialbed' },
  };
}

export default async function FeedstockPage({ params }: Props) {
  const { slug } = await params;
  const page = await load(slug);
  // Proposals and verdict history: the vote and decision routes revalidate this page (lib/http/revalidate.ts).
  const [verdictHistory, openProposals] = await Promise.all([listVerdictHistory(page.id), listOpenProposals(page.id)]);
  const withVerdict = page.settings.filter((s) => s.published || s.evidence);
  const disagreements = page.settings.filter((s) => s.disagree);

  return (
    <article className="space-y-10">
      <header className="space-y-3">
        <nav aria-label="Breadcrumb" className="text-sm">
          <ol className="flex list-none flex-wrap gap-1 p-0">
            <li>
              <Link href="/feedstocks">Feedstocks</Link>
              <span aria-hidden="true"> ›</span>
            </li>
            <li>
              <Link href={`/feedstocks?category=${page.category}`}>{CATEGORY_LABELS[page.category]}</Link>
              <span aria-hidden="true"> ›</span>
            </li>
            <li aria-current="page">{page.name}</li>
          </ol>
        </nav>
        <h1 className="text-4xl">{page.name}</h1>
        {page.summary ? <p className="max-w-prose text-lg">{page.summary}</p> : null}
        {page.aliases.length ? (
          <p className="text-ink-muted">
            Also called: {page.aliases.join(', ')}
            {page.family ? ` · ${page.family} family` : ''}
          </p>
        ) : null}
        <div className="flex flex-wrap items-center gap-x-6 gap-y-3">
          <UnitsToggle />
          <p className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
            <Link href={`/feedstocks/${page.slug}/edit`}>Edit this page</Link>
            <Link href={`/feedstocks/${page.slug}/history`}>Page history</Link>
            <a href={`#subscribe-${page.id}-heading`}>Follow by e-mail</a>
            <a href={`/feedstocks/${page.slug}/feed.xml`}>Updates feed (Atom)</a>
          </p>
        </div>
        {page.isDemo ? <p className="text-sm text-ink-muted">Demo data: the trials on this page are invented.</p> : null}
      </header>

      <section aria-labelledby="answer-heading" className="space-y-4">
        <h2 id="answer-heading" className="text-2xl">
          Can worms eat {page.name.toLowerCase()}?
        </h2>
        {withVerdict.length ? (
          <div className="grid gap-4 md:grid-cols-3">
            {withVerdict.map((s) => (
              <PublishedVerdictCard key={s.setting} section={s} />
            ))}
          </div>
        ) : (
          <p>
            No verdict yet: nobody has logged a trial. <Link href="/guides/running-a-feeding-trial">Run the first one</Link>.
          </p>
        )}
        {disagreements.length ? (
          <p role="note" className="max-w-prose rounded-md border-2 border-verdict-limit bg-verdict-limit-soft p-3">
            <strong>Heads up:</strong> newer trials disagree with the published verdict for{' '}
            {disagreements.map((s) => SETTING_LABELS[s.setting].toLowerCase()).join(' and ')}.{' '}
            <a href="#evidence-heading">See what the trials say</a>.
          </p>
        ) : null}
        <p className="text-sm text-ink-muted">
          Verdicts change only when a moderator decides a proposal. <Link href="/guides/reading-a-verdict">How to read a verdict</Link>.
        </p>
      </section>

      <VerdictHistorySection slug={page.slug} history={verdictHistory} open={openProposals} />

      <HandlingCautions codes={page.handlingCautions} />

      <section aria-labelledby="cautions-heading" className="space-y-3">
        <h2 id="cautions-heading" className="text-2xl">
          Cautions from the trials
        </h2>
        <EvidenceCautions settings={page.settings} />
      </section>

      <section aria-labelledby="prep-heading" className="space-y-3">
        <h2 id="prep-heading" className="text-2xl">
          Preparation
        </h2>
        <PreparationAdvice settings={page.settings} />
      </section>

      <section aria-labelledby="text-heading" className="space-y-3">
        <h2 id="text-heading" className="text-2xl">
          About {page.name.toLowerCase()}
        </h2>
        <div data-user-text-start="" hidden />
        <PageText source={page.pageText} />
        <div data-user-text-end="" hidden />
        <p className="text-sm text-ink-muted">
          Written by keepers; <Link href={`/feedstocks/${page.slug}/history`}>version {page.version}</Link>.
        </p>
      </section>

      <section aria-labelledby="evidence-heading" className="space-y-4">
        <h2 id="evidence-heading" className="text-2xl">
          What the trials say
        </h2>
        {page.settings.some((s) => s.evidence) ? (
          <div className="grid gap-4 lg:grid-cols-2">
            {page.settings.map((s) => (
              <EvidenceDerivation key={s.setting} section={s} />
            ))}
          </div>
        ) : (
          <p>No evidence verdict yet.</p>
        )}
      </section>

      <section aria-labelledby="trials-heading" className="space-y-4">
        <h2 id="trials-heading" className="text-2xl">
          Trials
        </h2>
        <TrialsTable trials={page.trials} name={page.name} />
        <OutcomeCharts page={page} />
      </section>

      <section aria-labelledby="km-heading" className="space-y-4">
        <h2 id="km-heading" className="text-2xl">
          How long it takes
        </h2>
        <p className="max-w-prose">
          Time from feeding until little was left and worms were working it (Kaplan–Meier estimate: trials still running count until their
          last check-in instead of being dropped).
        </p>
        <SurvivalCharts settings={page.settings} />
      </section>

      <SubscribePanel feedstockId={page.id} feedstockSlug={page.slug} feedstockName={page.name} />

      <RelatedFeedstocks related={page.related} family={page.family} />

      {page.reference.cnRatio !== null || page.reference.moisturePct !== null ? (
        <section aria-labelledby="ref-heading" className="space-y-2">
          <h2 id="ref-heading" className="text-2xl">
            Reference values
          </h2>
          <dl className="grid max-w-prose grid-cols-[auto_1fr] gap-x-4 gap-y-1">
            {page.reference.cnRatio !== null ? (
              <>
                <dt className="font-semibold">C:N ratio</dt>
                <dd>{formatNumber(page.reference.cnRatio, 3)}:1</dd>
              </>
            ) : null}
            {page.reference.nitrogenPct !== null ? (
              <>
                <dt className="font-semibold">Nitrogen</dt>
                <dd>{formatNumber(page.reference.nitrogenPct, 2)}% of dry mass</dd>
              </>
            ) : null}
            {page.reference.moisturePct !== null ? (
              <>
                <dt className="font-semibold">Moisture</dt>
                <dd>{formatNumber(page.reference.moisturePct, 2)}% of fresh mass</dd>
              </>
            ) : null}
            {page.reference.bulkDensityKgM3 !== null ? (
              <>
                <dt className="font-semibold">Bulk density</dt>
                <dd>{formatNumber(page.reference.bulkDensityKgM3, 3)} kg/m³</dd>
              </>
            ) : null}
          </dl>
          {page.reference.source ? <p className="max-w-prose text-sm text-ink-muted">Source: {page.reference.source}</p> : null}
          <p className="text-sm">
            <Link href="/tools/mix">Work out a mix with the C:N and moisture calculator</Link>
          </p>
        </section>
      ) : null}

      <footer className="border-t border-line pt-4 text-sm text-ink-muted">
        Last change {formatDate(page.lastChange)}. Guides: <Link href="/guides/reading-a-verdict">reading a verdict</Link>,{' '}
        <Link href="/guides/running-a-feeding-trial">running a feeding trial</Link>, <Link href="/guides/starting-a-worm-bin">starting a worm bin</Link>.
      </footer>
    </article>
  );
}
