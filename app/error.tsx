'use client';

import Link from 'next/link';
import { useLogError, type ErrorBoundaryProps } from '@/components/layout/error-boundary';
import { Button } from '@/components/ui/button';

export default function ErrorPage({ error, retry }: ErrorBoundaryProps) {
  useLogError(error);

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
