import type { Metadata } from 'next';
import Link from 'next/link';
import { listGuides } from '@/content/guides';
import { formatDate } from '@/lib/format';

export const metadata: Metadata = {
  title: 'Guides',
  description: 'Starting a worm bin, running a feeding trial, reading a verdict, and handling compost, manures and shredders safely.',
  alternates: { canonical: '/guides' },
  openGraph: { title: 'Guides — Trialbed', description: 'Practical guides for worm keepers.', type: 'website' },
};

export default async function GuidesPage() {
  const guides = await listGuides();
  return (
    <div className="space-y-6">
      <h1 className="text-3xl">Guides</h1>
      <p className="max-w-prose">Short, practical guides written for worm keepers, each with its sources.</p>
      <ul className="grid list-none gap-4 p-0 md:grid-cols-2">
        {guides.map((g) => (
          <li key={g.slug} className="space-y-2 rounded-lg border border-line bg-surface-raised p-4">
            <h2 className="text-xl">
              <Link href={`/guides/${g.slug}`}>{g.title}</Link>
            </h2>
            <p>{g.description}</p>
            <p className="text-sm text-ink-muted">Updated {formatDate(g.updated)}</p>
          </li>
        ))}
      </ul>
    </div>
  );
}
