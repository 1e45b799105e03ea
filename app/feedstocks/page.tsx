import type { Metadata } from 'next';
import Link from 'next/link';
import { z } from 'zod';
import { VerdictBadge } from '@/components/evidence/verdict-badge';
import { SETTINGS, SETTING_LABELS } from '@/components/layout/vocabulary';
import { Table } from '@/components/ui/table';
import { CATEGORIES } from '@/db/models/Feedstock';
import { listFeedstocks } from '@/lib/queries/feedstocks';

export const dynamic = 'force-dynamic';

export const metadata: Metadata = {
  title: 'Feedstocks',
  description: 'Every feedstock with its published verdict for enclosed bins, flow-through systems and open beds.',
};

const CATEGORY_LABELS: Record<(typeof CATEGORIES)[number], string> = {
  fruit: 'Fruit',
  vegetable: 'Vegetable',
  'grain-starch': 'Grain and starch',
  'paper-card': 'Paper and card',
  garden: 'Garden',
  manure: 'Manure',
  'animal-product': 'Animal product',
  other: 'Other',
};

const ParamsSchema = z.object({
  category: z.enum(CATEGORIES).optional().catch(undefined),
  q: z.string().max(120).optional().catch(undefined),
});

export default async function FeedstocksPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const params = ParamsSchema.parse(await searchParams);
  const all = await listFeedstocks({ category: params.category ?? null });
  const q = params.q?.trim().toLowerCase();
  const rows = q ? all.filter((r) => r.name.toLowerCase().includes(q) || (r.family ?? '').toLowerCase().includes(q)) : all;

  return (
    <div className="space-y-6">
      <header className="space-y-2">
        <h1 className="text-3xl">Feedstocks</h1>
        <p className="max-w-prose text-ink-muted">
          The published verdict for each setting. It changes only when a proposal is decided by a moderator.
        </p>
      </header>
      <nav aria-label="Filter by category" className="flex flex-wrap gap-2">
        <Link href="/feedstocks" className="rounded-full border border-line px-3 py-1.5" aria-current={!params.category ? 'page' : undefined}>
          All
        </Link>
        {CATEGORIES.map((c) => (
          <Link
            key={c}
            href={`/feedstocks?category=${c}`}
            className="rounded-full border border-line px-3 py-1.5 aria-[current=page]:bg-surface-sunken aria-[current=page]:font-semibold"
            aria-current={params.category === c ? 'page' : undefined}
          >
            {CATEGORY_LABELS[c]}
          </Link>
        ))}
      </nav>
      {q ? (
        <p>
          {rows.length} feedstock{rows.length === 1 ? '' : 's'} matching “{params.q}”.
        </p>
      ) : null}
      <Table caption={`${rows.length} feedstocks`}>
        <thead>
          <tr>
            <th scope="col">Feedstock</th>
            <th scope="col">Category</th>
            {SETTINGS.map((s) => (
              <th key={s} scope="col">
                {SETTING_LABELS[s]}
              </th>
            ))}
            <th scope="col">Trials</th>
            <th scope="col">Last change</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.slug}>
              <th scope="row" className="font-semibold">
                <Link href={`/feedstocks/${r.slug}`} className="underline decoration-line underline-offset-4">
                  {r.name}
                </Link>
              </th>
              <td>{CATEGORY_LABELS[r.category]}</td>
              {SETTINGS.map((s) => (
                <td key={s}>{r.published[s] ? <VerdictBadge verdict={r.published[s]!} size="sm" /> : <span className="text-ink-muted">—</span>}</td>
              ))}
              <td>{r.trialCount}</td>
              <td>
                <time dateTime={r.lastChange}>{r.lastChange.slice(0, 10)}</time>
              </td>
            </tr>
          ))}
        </tbody>
      </Table>
    </div>
  );
}
