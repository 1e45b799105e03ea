/** First focusable element on every page: jumps past the header to <main id="main">. */
export function SkipLink({ targetId = 'main' }: { targetId?: string }) {
  return (
    <a
      href={`#${targetId}`}
      className="sr-only focus:not-sr-only focus:fixed focus:left-3 focus:top-3 focus:z-50 focus:inline-flex focus:min-h-touch focus:items-center focus:rounded-md focus:bg-surface-raised focus:px-4 focus:font-semibold focus:text-ink focus:shadow-lg"
    >
      Skip to main content
    </a>
  );
}
