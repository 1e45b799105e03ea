import Link from 'next/link';

/** "Orange peel › Edit": the way back from a page under /feedstocks/[slug]/ to the feedstock. */
export function SubpageBreadcrumb({ feedstock, current }: { feedstock: { slug: string; name: string }; current: string }) {
  return (
    <nav aria-label="Breadcrumb" className="text-sm">
      <Link href={`/feedstocks/${feedstock.slug}`}>{feedstock.name}</Link> <span aria-hidden="true">›</span>
      {` ${current}`}
    </nav>
  );
}
