import type { Metadata } from 'next';
import Link from 'next/link';
import { RequestFeedstockForm } from '@/components/feedstock/request-form';

export const metadata: Metadata = {
  title: 'Request a feedstock',
  description: 'Ask for a page about a food scrap, bedding or garden material Trialbed does not cover yet.',
};

export default async function RequestPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { name } = await searchParams;
  const defaultName = typeof name === 'string' ? name.trim().slice(0, 160) : undefined;
  return (
    <div className="space-y-6">
      <h1 className="text-3xl">Request a feedstock</h1>
      <p className="max-w-prose">
        Before asking, <Link href={`/search${defaultName ? `?q=${encodeURIComponent(defaultName)}` : ''}`}>search</Link> under other names: many
        feedstocks go by several. Editors read every request; a new page starts with no verdict until keepers log trials.
      </p>
      <RequestFeedstockForm defaultName={defaultName} />
    </div>
  );
}
