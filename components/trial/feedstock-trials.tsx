import Link from 'next/link';
import { listTrialsForFeedstock } from '@/lib/queries/trials';
import { TrialList } from './trial-list';

/**
 * The trials of one feedstock, for embedding in its page (an async server
 * component): the newest 50, a link to the full filtered list, the exports
 * and "log a trial" for this feedstock.
 */
export async function FeedstockTrials({ slug, name, headingLevel = 2 }: { slug: string; name: string; headingLevel?: 2 | 3 }) {
  const rows = await listTrialsForFeedstock(slug);
  const Heading = headingLevel === 2 ? 'h2' : 'h3';
  return (
    <section aria-labelledby="feedstock-trials-heading" className="space-y-3">
      <Heading id="feedstock-trials-heading" className="text-2xl">
        Trials of {name}
      </Heading>
      <TrialList rows={rows} caption={`Trials of ${name}`} showFeedstock={false} />
      <p className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
        <Link href={`/trials?feedstock=${slug}`}>All trials of {name}</Link>
        <Link href={`/trials/new?feedstock=${slug}`}>Log a trial</Link>
        <a href={`/api/feedstocks/${slug}/export.csv`}>Download CSV</a>
        <a href={`/api/feedstocks/${slug}/export.json`}>Download JSON</a>
        <span className="text-ink-muted">(CC BY-SA 4.0)</span>
      </p>
    </section>
  );
}
