import type { Metadata } from 'next';
import Link from 'next/link';
import { VerdictBadge } from '@/components/evidence/verdict-badge';
import { SETTINGS, SETTING_LABELS } from '@/components/layout/vocabulary';
import { RequestFeedstockForm } from '@/components/feedstock/request-form';
import { SearchBox } from '@/components/search/search-box';
import { searchFeedstocks } from '@/lib/queries/search';
import type { SearchHit } from '@/lib/search/engine';
import { SearchQuerySchema } from '@/lib/validation/feedstocks';

export const dynamic = 'force-dynamic';

export const metadata: Metadata = {
  title: 'Search feedstocks',
  description: 'Can worms eat it? Search every feedstock by name, other names, family or category.',
  robots: { index: false, follow: true },
};

function Hit({ hit }: { hit: SearchHit }) {
  const settings = SETTINGS.filter((s) => hit.published[s]);
  return (
    <li className="space-y-2 rounded-lg border border-line bg-surface-raised p-4">
      <h2 className="text-xl">
        <Link href={`/feedstocks/${hit.slug}`}>{hit.name}</Link>
      </h2>
      {hit.matchedAlias ? <p className="text-ink-muted">Also called “{hit.matchedAlias}”</p> : null}
      <p>{hit.summary}</p>
      {settings.length ? (
        <ul className="flex list-none flex-wrap gap-x-4 gap-y-2 p-0">
          {settings.map((s) => (
            <li key={s} className="inline-flex items-center gap-2">
              <span className="text-ink-muted">{SETTING_LABELS[s]}:</span>
              <VerdictBadge verdict={hit.published[s]!} size="sm" />
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-ink-muted">No published verdict yet.</p>
      )}
    </li>
  );
}

/** Search results without JavaScript, and where Enter lands when nothing matched. */
export default async function SearchPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const raw = await searchParams;
  const parsed = SearchQuerySchema.safeParse({ q: Array.isArray(raw.q) ? raw.q[0] : raw.q, limit: 20 });
  const q = parsed.success ? parsed.data.q : '';
  const outcome = q ? await searchFeedstocks(q, 20) : { terms: [], results: [], suggestions: [] };
  return (
    <div className="space-y-8">
      <SearchBox variant="hero" id="search-page-q" label="Can worms eat …?" labelAsHeading defaultValue={q} />
      {!parsed.success ? <p role="alert">{parsed.error.issues[0]?.message}</p> : null}
      {q && outcome.results.length ? (
        <section aria-labelledby="results-heading" className="space-y-3">
          <p id="results-heading" className="text-lg" role="status">
            {outcome.results.length} {outcome.results.length === 1 ? 'feedstock matches' : 'feedstocks match'} “{q}”
            {outcome.terms.length ? <span className="text-ink-muted"> (searched for: {outcome.terms.join(' ')})</span> : null}.
          </p>
          <ul className="list-none space-y-3 p-0">
            {outcome.results.map((h) => (
              <Hit key={h.slug} hit={h} />
            ))}
          </ul>
        </section>
      ) : null}
      {q && !outcome.results.length ? (
        <section aria-labelledby="nomatch-heading" className="space-y-4">
          <h2 id="nomatch-heading" className="text-2xl" role="status">
            No feedstock matches “{q}”
          </h2>
          {outcome.suggestions.length ? (
            <>
              <p>Did you mean:</p>
              <ul className="list-none space-y-3 p-0">
                {outcome.suggestions.map((h) => (
                  <Hit key={h.slug} hit={h} />
                ))}
              </ul>
            </>
          ) : outcome.terms.length === 0 ? (
            <p>Type the name of a food scrap, bedding or garden material, like “banana peel” or “cardboard”.</p>
          ) : (
            <p>
              Try another name for it, or <Link href="/feedstocks">browse all feedstocks</Link>.
            </p>
          )}
          {outcome.terms.length ? <RequestFeedstockForm defaultName={q.slice(0, 160)} /> : null}
        </section>
      ) : null}
    </div>
  );
}
