import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getGuide, listGuides } from '@/content/guides';
import { formatDate } from '@/lib/format';

type Props = { params: Promise<{ slug: string }> };

export const dynamicParams = false;

export async function generateStaticParams() {
  return (await listGuides()).map((g) => ({ slug: g.slug }));
}

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const guide = await getGuide((await params).slug);
  if (!guide) return {};
  return {
    title: guide.meta.title,
    description: guide.meta.description,
    alternates: { canonical: `/guides/${guide.meta.slug}` },
    openGraph: { title: `${guide.meta.title} — Trialbed`, description: guide.meta.description, type: 'article', url: `/guides/${guide.meta.slug}` },
  };
}

export default async function GuidePage({ params }: Props) {
  const guide = await getGuide((await params).slug);
  if (!guide) notFound();
  return (
    <article className="space-y-4">
      <nav aria-label="Breadcrumb" className="text-sm">
        <Link href="/guides">Guides</Link> <span aria-hidden="true">›</span> {guide.meta.title}
      </nav>
      <h1 className="text-4xl">{guide.meta.title}</h1>
      <p className="max-w-prose text-lg text-ink-muted">{guide.meta.description}</p>
      <p className="text-sm text-ink-muted">
        Updated <time dateTime={guide.meta.updated}>{formatDate(guide.meta.updated)}</time>
      </p>
      <div className="page-text">{guide.content}</div>
    </article>
  );
}
