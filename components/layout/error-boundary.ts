'use client';

import { useEffect } from 'react';

/** What Next.js hands an error boundary (app/error.tsx, app/global-error.tsx). */
export type ErrorBoundaryProps = {
  error: unknown;
  /** Re-fetches and re-renders what failed: the segment (error.tsx) or the whole app (global-error.tsx). */
  retry: () => void;
  reset: () => void;
};

/** Logs the error to the browser console once per error, for whoever is debugging. */
export function useLogError(error: unknown): void {
  useEffect(() => {
    console.error(error);
  }, [error]);
}
