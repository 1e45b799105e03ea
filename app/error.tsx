'use client';

import { useEffect } from 'react';
import Link from 'next/link';
import { Button } from '@/components/ui/button';

export default function ErrorPage({
  error,
  retry,
}: {
  error: unknown;
  /** Re-fetches and re-renders the failed segment. */
  retry: () => void;
  reset: () => void;
}) {
  useEffect(() => {
    console.error(error);
  }, [error]);

  const digest =
    error instanceof Error && 'digest' in error && typeof error.digest === 'string'
      ? error.digest
      : undefined;

  return (
    <div role="alert" className="max-w-prose space-y-5">
      <h1 className="text-4xl">Something went wrong</h1>
      <p className="text-lg">
        This page hit a problem on our side, not yours. Try again; if it keeps failing, come back
        in a few minutes.
      </p>
      {digest ? <p className="text-sm text-ink-muted">Reference: {digest}</p> : null}
      <div className="flex flex-wrap items-center gap-3">
        <Button onClick={() => retry()}>Try again</Button>
        <Link href="/">Go to the home page</Link>
      </div>
    </div>
  );
}
