'use client';

import { useLogError, type ErrorBoundaryProps } from '@/components/layout/error-boundary';
import { bodyFont, headingFont } from '@/fonts';
import './globals.css';

/** Replaces the root layout when it fails, so it brings its own document and styles. */
export default function GlobalError({ error, retry }: ErrorBoundaryProps) {
  useLogError(error);

  return (
    <html lang="en" className={`${bodyFont.variable} ${headingFont.variable}`}>
      <body className="flex min-h-dvh items-center justify-center bg-surface px-4 text-ink">
        <title>Something went wrong · Trialbed</title>
        <main role="alert" className="max-w-prose space-y-5 py-12">
          <p className="font-display text-2xl">Trialbed</p>
          <h1 className="text-4xl">The whole site tripped over</h1>
          <p className="text-lg">
            Something failed before the page could load. Try again; if it keeps happening, come
            back a little later.
          </p>
          <div className="flex flex-wrap items-center gap-3">
            <button
              type="button"
              onClick={() => retry()}
              className="inline-flex min-h-touch items-center rounded-md bg-accent px-4 font-semibold text-accent-ink hover:bg-accent-strong"
            >
              Try again
            </button>
            {/* A plain anchor on purpose: a full page load rebuilds the failed root layout. */}
            {/* eslint-disable-next-line @next/next/no-html-link-for-pages */}
            <a href="/">Go to the home page</a>
          </div>
        </main>
      </body>
    </html>
  );
}
