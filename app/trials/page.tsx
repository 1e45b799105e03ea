import type { Metadata } from 'next';
import Link from 'next/link';
import { SETTINGS, SETTING_LABELS } from '@/components/layout/vocabulary';
import { TrialList } from '@/components/trial/trial-list';
import { STATUS_LABELS } from '@/components/trial/vocabulary';
import { buttonClasses } from '@/components/ui/button';
import { FilterSelect, optionsOf } from '@/components/ui/filter-select';
import { LinkButton } from '@/components/ui/link-button';
import { Pagination } from '@/components/ui/pagination';
import { listTrialFilterOptions, listTrials } from '@/lib/queries/trials';
import { contributorName } from '@/lib/trials/contributor';
import { TRIAL_STATUSES, TrialListQuerySchema, type TrialListQuery } from '@/lib/validation/trials';

export const dynamic = 'force-dynamic';

export const metadata: Metadata = {
  title: 'Trials',
  description: 'Feeding trials logged by worm keepers: what went in, how much, and what the worms made of it.',
};

const selectClass = 'min-h-touch w-full rounded-md border border-line-strong bg-surface-raised px-3';

/** The list's address with some filters changed (page resets unless given). */
function hrefWith(q: TrialListQuery, change: Partial<TrialListQuery>): string {
  const merged = { ...q, page: 1, ...change };
  const params = new URLSearchParams();
  for (const k of ['feedstock', 'setting', 'status', 'contributor'] as const) if (merged[k]) params.set(k, String(merged[k]));
  if (merged.page && merged.page > 1) params.set('page', String(merged.page));
  const s = params.toString();
  return s ? `/trials?${s}` : '/trials';
}

export default async function TrialsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const raw = await searchParams;
  const q = TrialListQuerySchema.parse(Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v])));
  const [page, options] = await Promise.all([listTrials(q), listTrialFilterOptions()]);
  const from = page.total ? (page.page - 1) * page.perPage + 1 : 0;
  const to = Math.min(page.total, page.page * page.perPage);
  const filtered = !!(q.feedstock || q.setting || q.status || q.contributor);

  return (
    <div className="space-y-6">
      <header className="flex flex-wrap items-end justify-between gap-4">
        <div className="space-y-2">
          <h1 className="text-3xl">Trials</h1>
          <p className="max-w-prose text-ink-muted">
            A measured amount of one feedstock in one bed or bin, checked every week or two. Every trial feeds the evidence on
            its feedstock’s page.
          </p>
        </div>
        <LinkButton href="/trials/new">Log a trial</LinkButton>
      </header>

      <form method="get" action="/trials" className="grid grid-cols-2 gap-3 rounded-lg border border-line bg-surface-raised p-4 lg:grid-cols-[repeat(4,minmax(0,1fr))_auto]" aria-label="Filter trials">
        <FilterSelect
          name="feedstock"
          label="Feedstock"
          value={q.feedstock ?? ''}
          anyLabel="All feedstocks"
          options={options.feedstocks.map((f) => ({ value: f.slug, label: f.name }))}
          selectClassName={selectClass}
        />
        <FilterSelect name="setting" label="Setting" value={q.setting ?? ''} anyLabel="All settings" options={optionsOf(SETTINGS, SETTING_LABELS)} selectClassName={selectClass} />
        <FilterSelect name="status" label="Status" value={q.status ?? ''} anyLabel="Any status" options={optionsOf(TRIAL_STATUSES, STATUS_LABELS)} selectClassName={selectClass} />
        <FilterSelect
          name="contributor"
          label="Contributor"
          value={q.contributor ?? ''}
          anyLabel="Anyone"
          options={options.contributors.map((c) => ({ value: c, label: contributorName(c) }))}
          selectClassName={selectClass}
        />
        <div className="col-span-2 flex items-end gap-2 lg:col-span-1">
          <button type="submit" className={buttonClasses('primary')}>
            Show
          </button>
          {filtered ? (
            <Link href="/trials" className={buttonClasses('quiet')}>
              Clear
            </Link>
          ) : null}
        </div>
      </form>

      <p aria-live="polite">
        {page.total ? `Trials ${from}–${to} of ${page.total}` : 'No trials match these filters.'}
        {filtered ? ' (filtered)' : ''}.
      </p>

      <TrialList rows={page.rows} caption={`Trials ${from}–${to} of ${page.total}`} />

      <Pagination page={page.page} pageCount={page.pageCount} hrefFor={(n) => hrefWith(q, { page: n })} />

      <p className="text-sm text-ink-muted">
        Open data: <a href="/api/export/trials.csv">all trials as CSV</a>, <a href="/api/export/trials.csv?table=check-ins">their check-ins as CSV</a>,{' '}
        <a href="/api/export/trials.json">both as JSON</a> — under <a href="https://creativecommons.org/licenses/by-sa/4.0/" rel="license">CC BY-SA 4.0</a>.
        Contributors appear under a pseudonymous label; places as regions only.
      </p>
    </div>
  );
}
