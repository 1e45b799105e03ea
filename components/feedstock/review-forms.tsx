'use client';

import { useActionState } from 'react';
import { decideRequestAction, reviewEditAction } from '@/app/feedstocks/actions';
import { fieldError, FormMessage } from '@/components/forms/form-message';
import { Button } from '@/components/ui/button';
import type { ActionState } from '@/lib/errors';

/** Approve or reject a suggested edit; a rejection needs a note for the author. */
export function ReviewEditForm({ revisionId, stale }: { revisionId: number; stale: boolean }) {
  const [state, action, pending] = useActionState<ActionState, FormData>(reviewEditAction, { ok: false });
  const noteId = `review-note-${revisionId}`;
  const noteError = fieldError(state, 'note');
  if (state.ok) return <FormMessage state={state} />;
  return (
    <form action={action} className="space-y-3">
      <input type="hidden" name="revisionId" value={revisionId} />
      <FormMessage state={state} />
      <div className="flex flex-col gap-1">
        <label htmlFor={noteId} className="font-semibold">
          Note to the author <span className="font-normal text-ink-muted">(required to reject)</span>
        </label>
        <textarea
          id={noteId}
          name="note"
          rows={2}
          maxLength={2000}
          aria-invalid={noteError ? true : undefined}
          aria-describedby={noteError ? `${noteId}-error` : undefined}
          className="w-full rounded-md border border-line-strong bg-surface-raised px-3 py-2"
        />
        {noteError ? (
          <p id={`${noteId}-error`} className="text-sm font-semibold text-danger">
            {noteError}
          </p>
        ) : null}
      </div>
      <div className="flex flex-wrap gap-3">
        <Button type="submit" name="decision" value="approve" disabled={pending || stale}>
          Approve and publish
        </Button>
        <Button type="submit" name="decision" value="reject" variant="danger" disabled={pending}>
          Reject with note
        </Button>
      </div>
      {stale ? <p className="text-sm">The page changed after this was suggested, so it cannot be approved as it is: reject it with a note asking for a redo on the current text.</p> : null}
    </form>
  );
}

/** Decline or reopen a feedstock request. */
export function RequestDecisionForm({ requestId, status }: { requestId: number; status: 'open' | 'declined' }) {
  const [state, action, pending] = useActionState<ActionState, FormData>(decideRequestAction, { ok: false });
  return (
    <form action={action} className="inline-flex flex-col gap-1">
      <input type="hidden" name="requestId" value={requestId} />
      <input type="hidden" name="status" value={status === 'open' ? 'declined' : 'open'} />
      <Button type="submit" variant="secondary" disabled={pending || state.ok}>
        {status === 'open' ? 'Decline' : 'Reopen'}
      </Button>
      <FormMessage state={state} />
    </form>
  );
}
