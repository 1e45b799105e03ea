import type { Metadata } from 'next';
import Link from 'next/link';
import { CertaintyBadge, VerdictBadge, VERDICT_LABELS, VERDICTS } from '@/components/evidence/verdict-badge';
import { CATEGORIES, CATEGORY_LABELS, SETTINGS, SETTING_LABELS } from '@/components/layout/vocabulary';
import { buttonClasses } from '@/components/ui/button';
import { FilterSelect, optionsOf } from '@/components/ui/filter-select';
import { Pagination } from '@/components/ui/pagination';
import { Table } from '@/components/ui/table';
import { formatDate } from '@/lib/format';
import { listFeedstockIndex, type IndexSort } from '@/lib/queries/feedstocks';
import { FeedstockIndexParamsSchema, type FeedstockIndexParams } from '@/lib/validation/feedstocks';

export const dynamic = 'force-dynamic';

export const metadata: Metadata = {
  title: 'Feedstocks',
  description: 'Every feedstock with its published verdict for enclosed bins, flow-through systems and open beds, its certainty and trials.',
  alternates: { canonical: '/feedstocks' },
  openGraph: { title: 'Feedstocks — Trialbed', description: 'What composting worms can eat, per setting, from feeding trials.', type: 'website' },
};

type SearchParams = Promise<Record<string, string | string[] | undefined>>;

/** The index URL for a state, leaving defaults out so addresses stay short. */
function hrefFor(state: FeedstockIndexParams, change: Partial<FeedstockIndexParams>): string {
  const next = { ...state, ...change };
  const q = new URLSearchParams();
  if (next.q) q.set('q', next.q);
  if (next.category) q.set('category', next.category);
  if (next.setting) q.set('setting', next.setting);
  if (next.verdict) q.set('verdict', next.verdict);
  if (next.sort !== 'name') q.set('sort', next.sort);
  if (next.dir !== 'asc') q.set('dir', next.dir);
  if (next.per !== 50) q.set('per', String(next.per));
  if (next.page > 1) q.set('page', String(next.page));
  const s = q.toString();
  return s ? `/feedstocks?${s}` : '/feedstocks';
}

function SortHeader({ state, sort, children }: { state: FeedstockIndexParams; sort: IndexSort; children: string }) {
  const active = state.sort === sort;
  const nextDir = active && state.dir === 'asc' ? 'desc' : 'asc';
  return (
    <th scope="col" aria-sort={active ? (state.dir === 'asc' ? 'ascending' : 'descending') : undefined}>
      <Link href={hrefFor(state, { sort, dir: nextDir, page: 1 })} className="inline-flex items-center gap-1 text-ink no-underline hover:underline">
        {children}
        <span aria-hidden="true" className="text-ink-muted">
          {active ? (state.dir === 'asc' ? '▲' : '▼') : '↕'}
        </span>
        <span className="sr-only">{active ? `, sorted ${state.dir === 'asc' ? 'ascending' : 'descending'}; sort ${nextDir === 'asc' ? 'ascending' : 'descending'}` : ', sort'}</span>
      </Link>
    </th>
  );
}

const selectClass = 'min-h-touch rounded-md border border-line-strong bg-surface-raised px-3 text-base text-ink';
const PER_PAGE_OPTIONS = [25, 50, 100].map((n) => ({ value: String(n), label: String(n) }));

export default async function FeedstocksPage({ searchParams }: { searchParams: SearchParams }) {
  const state = FeedstockIndexParamsSchema.parse(await searchParams);
  const result = await listFeedstockIndex({
    category: state.category,
    setting: state.setting,
    verdict: state.verdict,
    q: state.q,
    sort: state.sort,
    dir: state.dir,
    page: state.page,
    perPage: state.per,
  });
  const filtered = !!(state.category || state.setting || state.verdict || state.q);
  const first = (result.page - 1) * state.per + 1;
  const last = first + result.rows.length - 1;

  return (
    <div className="space-y-6">
      <header className="space-y-2">
        <h1 className="text-3xl">Feedstocks</h1>
        <p className="max-w-prose text-ink-muted">
          The published verdict for each setting, how certain the evidence is, and how many trials back it. A verdict changes only when a moderator
          decides a proposal. Looking for something that is not here? <Link href="/feedstocks/request">Request a feedstock</Link>.
        </p>
      </header>

      <form method="get" action="/feedstocks" className="flex flex-wrap items-end gap-3 rounded-lg border border-line bg-surface-raised p-4" aria-label="Filter feedstocks">
        {state.q ? <input type="hidden" name="q" value={state.q} /> : null}
        {state.sort !== 'name' ? <input type="hidden" name="sort" value={state.sort} /> : null}
        {state.dir !== 'asc' ? <input type="hidden" name="dir" value={state.dir} /> : null}
        <FilterSelect name="category" label="Category" value={state.category ?? ''} anyLabel="Any category" options={optionsOf(CATEGORIES, CATEGORY_LABELS)} selectClassName={selectClass} />
        <FilterSelect name="verdict" label="Verdict" value={state.verdict ?? ''} anyLabel="Any verdict" options={optionsOf(VERDICTS, VERDICT_LABELS)} selectClassName={selectClass} />
        <FilterSelect name="setting" label="In setting" value={state.setting ?? ''} anyLabel="Any setting" options={optionsOf(SETTINGS, SETTING_LABELS)} selectClassName={selectClass} />
        <FilterSelect name="per" label="Per page" value={String(state.per)} options={PER_PAGE_OPTIONS} selectClassName={selectClass} />
        <button type="submit" className={buttonClasses('primary')}>
          Show
        </button>
        {filtered ? (
          <Link href="/feedstocks" className="inline-flex min-h-touch items-center">
            Clear filters
          </Link>
        ) : null}
      </form>

      <p aria-live="polite">
        {result.total === 0
          ? 'No feedstock matches these filters.'
          : `Showing ${first}–${last} of ${result.total} feedstock${result.total === 1 ? '' : 's'}${state.q ? ` matching “${state.q}”` : ''}.`}
      </p>

      {result.rows.length ? (
        <Table caption={`Feedstocks, page ${result.page} of ${result.pages}`} hideCaption>
          <thead>
            <tr>
              <SortHeader state={state} sort="name">
                Feedstock
              </SortHeader>
              <SortHeader state={state} sort="category">
                Category
              </SortHeader>
              {SETTINGS.map((s) => (
                <th key={s} scope="col">
                  {SETTING_LABELS[s]}
                </th>
              ))}
              <SortHeader state={state} sort="certainty">
                Certainty
              </SortHeader>
              <SortHeader state={state} sort="trials">
                Trials
              </SortHeader>
              <SortHeader state={state} sort="changed">
                Last change
              </SortHeader>
            </tr>
          </thead>
          <tbody>
            {result.rows.map((r) => (
              <tr key={r.slug}>
                <th scope="row" className="border-t border-line font-semibold">
                  <Link href={`/feedstocks/${r.slug}`}>{r.name}</Link>
                </th>
                <td>{CATEGORY_LABELS[r.category]}</td>
                {SETTINGS.map((s) => (
                  <td key={s}>
                    {r.published[s] ? (
                      <VerdictBadge verdict={r.published[s]!} size="sm" />
                    ) : (
                      <span className="text-ink-muted">
                        —<span className="sr-only">no verdict</span>
                      </span>
                    )}
                  </td>
                ))}
                <td>{r.certainty ? <CertaintyBadge grade={r.certainty} size="sm" /> : <span className="text-ink-muted">no evidence</span>}</td>
                <td>{r.trialCount}</td>
                <td className="whitespace-nowrap">
                  <time dateTime={r.lastChange}>{formatDate(r.lastChange)}</time>
                </td>
              </tr>
            ))}
          </tbody>
        </Table>
      ) : null}

      <Pagination page={result.page} pageCount={result.pages} hrefFor={(page) => hrefFor(state, { page })} variant="numbers" />
    </div>
  );
}
