'use client';

import { useActionState } from 'react';
import { acceptContributionLicence } from '@/app/account/actions';
import { Button } from '@/components/ui';
import type { ActionState } from '@/lib/errors';
import { fieldError, FormMessage } from './form-message';

/** A reader ticks the box and accepts the contribution licence (CC BY-SA 4.0). */
export function LicenceForm({ licenceName, licenceUrl }: { licenceName: string; licenceUrl: string }) {
  const [state, action, pending] = useActionState<ActionState, FormData>(acceptContributionLicence, { ok: false });
  const error = fieldError(state, 'accept');
  if (state.ok) {
    return (
      <p role="status" className="rounded-md bg-accent-soft p-3 font-semibold text-accent-strong">
        {state.message}
      </p>
    );
  }
  return (
    <form action={action} className="space-y-3">
      <label className="flex cursor-pointer items-start gap-3">
        <input
          type="checkbox"
          name="accept"
          required
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? 'accept-error' : undefined}
          className="mt-1 size-5 shrink-0 accent-accent"
        />
        <span>
          I agree that the text and data I contribute (trial records, check-ins, proposals, vote reasons, page edits) are
          published under <a href={licenceUrl}>{licenceName}</a>, so anyone may share and adapt them with credit and under the
          same licence.
        </span>
      </label>
      {error ? (
        <p id="accept-error" className="text-sm font-semibold text-danger">
          {error}
        </p>
      ) : null}
      <Button type="submit" disabled={pending}>
        {pending ? 'Saving…' : 'Accept and become a contributor'}
      </Button>
      <FormMessage state={state} />
    </form>
  );
}
