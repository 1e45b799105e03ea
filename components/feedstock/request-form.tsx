'use client';

import { useActionState } from 'react';
import { requestFeedstockAction, type RequestFormState } from '@/app/feedstocks/actions';
import { fieldError, FormMessage } from '@/components/forms/form-message';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';

/** "Request this feedstock": anyone may ask; editors see the list. */
export function RequestFeedstockForm({ defaultName, headingLevel = 2 }: { defaultName?: string; headingLevel?: 2 | 3 }) {
  const [state, action, pending] = useActionState<RequestFormState, FormData>(requestFeedstockAction, { ok: false });
  const Heading = headingLevel === 2 ? 'h2' : 'h3';
  return (
    <form action={action} className="max-w-prose space-y-4 rounded-lg border border-line bg-surface-raised p-4" aria-labelledby="request-heading" noValidate>
      <Heading id="request-heading" className="text-xl">
        Request a feedstock
      </Heading>
      <p className="text-ink-muted">Tell the editors what you want to feed your worms. No account needed.</p>
      <FormMessage state={state} />
      <Field
        label="Feedstock"
        name="name"
        id="request-name"
        required
        maxLength={160}
        defaultValue={state.ok ? '' : defaultName}
        error={fieldError(state, 'name')}
        hint="What it is usually called, e.g. “spent brewing grain”."
      />
      <div className="flex flex-col gap-1">
        <label htmlFor="request-note" className="font-semibold text-ink">
          Anything we should know <span className="font-normal text-ink-muted">(optional)</span>
        </label>
        <textarea
          id="request-note"
          name="note"
          rows={3}
          maxLength={2000}
          aria-invalid={fieldError(state, 'note') ? true : undefined}
          aria-describedby={fieldError(state, 'note') ? 'request-note-error' : undefined}
          className="w-full rounded-md border border-line-strong bg-surface-raised px-3 py-2 text-base text-ink"
        />
        {fieldError(state, 'note') ? (
          <p id="request-note-error" className="text-sm font-semibold text-danger">
            {fieldError(state, 'note')}
          </p>
        ) : null}
      </div>
      <Button type="submit" disabled={pending}>
        {pending ? 'Sending…' : 'Send the request'}
      </Button>
    </form>
  );
}
