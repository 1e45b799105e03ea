'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui';
import { postJson } from './post-json';

/** The author resubmits a rejected or stale proposal against the current verdict. */
export function ResubmitButton({ proposalId }: { proposalId: number }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  async function resubmit() {
    const r = await postJson<{ id: number }>(`/api/proposals/${proposalId}/resubmit`, {});
    if (r.ok) router.push(`/proposals/${r.data.id}`);
    else setError(r.message);
  }
  return (
    <div className="space-y-1">
      <Button onClick={resubmit}>Resubmit against the current verdict</Button>
      {error ? <p className="text-sm text-danger">{error}</p> : null}
    </div>
  );
}
