'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui';
import { postJson } from './post-json';

/** A moderator's hide/restore toggle for a proposal or a vote; asks for a reason. */
export function HideButton({ url, hidden, what }: { url: string; hidden: boolean; what: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  async function toggle() {
    const reason = window.prompt(`Why ${hidden ? 'restore' : 'hide'} this ${what}?`);
    if (!reason) return;
    const r = await postJson(url, { hidden: !hidden, reason });
    if (!r.ok) setError(r.message);
    else router.refresh();
  }
  return (
    <span>
      <Button variant="quiet" onClick={toggle}>
        {hidden ? `Restore ${what}` : `Hide ${what}`}
      </Button>
      {error ? <span className="ml-2 text-sm text-danger">{error}</span> : null}
    </span>
  );
}
