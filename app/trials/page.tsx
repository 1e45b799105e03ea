import type { Metadata } from 'next';
import Link from 'next/link';
import { SETTINGS, SETTING_LABELS } from '@/components/layout/vocabulary';
import { TrialList } from '@/components/trial/trial-list';
import { STATUS_LABELS } from '@/components/trial/vocabulary';
import { buttonClasses } from '@/components/ui/button';
import { LinkButton } from '@/components/ui/link-button';
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
        <div className="flex flex-col gap-1">
          <label htmlFor="filter-feedstock" className="font-semibold">
            Feedstock
          </label>
          <select id="filter-feedstock" name="feedstock" defaultValue={q.feedstock ?? ''} className={selectClass}>
            <option value="">All feedstocks</option>
            {options.feedstocks.map((f) => (
              <option key={f.slug} value={f.slug}>
                {f.name}
              </option>
            ))}
          </select>
        </div>
        <div className="flex flex-col gap-1">
          <label htmlFor="filter-setting" className="font-semibold">
            Setting
          </label>
          <select id="filter-setting" name="setting" defaultValue={q.setting ?? ''} className={selectClass}>
            <option value="">All settings</option>
            {SETTINGS.map((s) => (
              <option key={s} value={s}>
                {SETTING_LABELS[s]}
              </option>
            ))}
          </select>
        </div>
        <div className="flex flex-col gap-1">
          <label htmlFor="filter-status" className="font-semibold">
            Status
          </label>
          <select id="filter-status" name="status" defaultValue={q.status ?? ''} className={selectClass}>
            <option value="">Any status</option>
            {TRIAL_STATUSES.map((s) => (
              <option key={s} value={s}>
                {STATUS_LABELS[s]}
              </option>
            ))}
          </select>
        </div>
        <div className="flex flex-col gap-1">
          <label htmlFor="filter-contributor" className="font-semibold">
            Contributor
          </label>
          <select id="filter-contributor" name="contributor" defaultValue={q.contributor ?? ''} className={selectClass}>
            <option value="">Anyone</option>
            {options.contributors.map((c) => (
              <option key={c} value={c}>
                {contributorName(c)}
              </option>
            ))}
          </select>
        </div>
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

      {page.pageCount > 1 ? (
        <nav aria-label="Pages" className="flex flex-wrap items-center gap-2">
          {page.page > 1 ? (
            <Link href={hrefWith(q, { page: page.page - 1 })} className={buttonClasses('secondary')} rel="prev">
              Previous
            </Link>
          ) : null}
          <span className="px-2">
            Page {page.page} of {page.pageCount}
          </span>
          {page.page < page.pageCount ? (
            <Link href={hrefWith(q, { page: page.page + 1 })} className={buttonClasses('secondary')} rel="next">
              Next
            </Link>
          ) : null}
        </nav>
      ) : null}

      <p className="text-sm text-ink-muted">
        Open data: <a href="/api/export/trials.csv">all trials as CSV</a>, <a href="/api/export/trials.csv?table=check-ins">their check-ins as CSV</a>,{' '}
        <a href="/api/export/trials.json">both as JSON</a> — under <a href="https://creativecommons.org/licenses/by-sa/4.0/" rel="license">CC BY-SA 4.0</a>.
        Contributors appear under a pseudonymous label; places as regions only.
      </p>
    </div>
  );
}
