import Link from 'next/link';
import { buttonClasses } from './button';

export type PaginationProps = {
  /** The page shown now (1-based). */
  page: number;
  pageCount: number;
  /** The address of a page, keeping the list's other parameters. */
  hrefFor: (page: number) => string;
  /**
   * 'numbers': links to the first, the last and the pages near this one;
   * 'count': "Page 2 of 5" between Previous and Next.
   */
  variant?: 'numbers' | 'count';
};

const pageLinkClass =
  'inline-flex min-h-touch min-w-touch items-center justify-center rounded-md border border-line-strong px-2 aria-[current=page]:bg-accent aria-[current=page]:text-accent-ink';

/** Previous / next links (rel=prev, rel=next) for a paged list; nothing when there is one page. */
export function Pagination({ page, pageCount, hrefFor, variant = 'count' }: PaginationProps) {
  if (pageCount <= 1) return null;
  return (
    <nav aria-label="Pages" className="flex flex-wrap items-center gap-2">
      {page > 1 ? (
        <Link href={hrefFor(page - 1)} className={buttonClasses('secondary')} rel="prev">
          Previous
        </Link>
      ) : null}
      {variant === 'numbers' ? (
        <ol className="flex list-none flex-wrap gap-1 p-0">
          {Array.from({ length: pageCount }, (_, i) => i + 1)
            .filter((n) => n === 1 || n === pageCount || Math.abs(n - page) <= 2)
            .map((n, i, arr) => (
              <li key={n} className="flex items-center gap-1">
                {i > 0 && n - arr[i - 1] > 1 ? <span aria-hidden="true">…</span> : null}
                <Link href={hrefFor(n)} aria-current={n === page ? 'page' : undefined} className={pageLinkClass}>
                  <span className="sr-only">Page </span>
                  {n}
                </Link>
              </li>
            ))}
        </ol>
      ) : (
        <span className="px-2">
          Page {page} of {pageCount}
        </span>
      )}
      {page < pageCount ? (
        <Link href={hrefFor(page + 1)} className={buttonClasses('secondary')} rel="next">
          Next
        </Link>
      ) : null}
    </nav>
  );
}
