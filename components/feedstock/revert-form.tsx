'use client';

import { useActionState } from 'react';
import { revertAction } from '@/app/feedstocks/actions';
import { FormMessage } from '@/components/forms/form-message';
import { Button } from '@/components/ui/button';
import type { ActionState } from '@/lib/errors';

/** An editor's "revert to this version" (a new published revision with the old text). */
export function RevertForm({ feedstockId, revisionId, version, baseVersion }: { feedstockId: number; revisionId: number; version: number; baseVersion: number }) {
  const [state, action, pending] = useActionState<ActionState, FormData>(revertAction, { ok: false });
  return (
    <form action={action} className="space-y-2">
      <input type="hidden" name="feedstockId" value={feedstockId} />
      <input type="hidden" name="revisionId" value={revisionId} />
      <input type="hidden" name="baseVersion" value={baseVersion} />
      <Button type="submit" variant="secondary" disabled={pending || state.ok}>
        {pending ? 'Reverting…' : `Revert to version ${version}`}
      </Button>
      <FormMessage state={state} />
    </form>
  );
}
