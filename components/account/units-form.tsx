'use client';

import { useActionState } from 'react';
import { saveUnits } from '@/app/account/actions';
import { Button } from '@/components/ui';
import type { ActionState } from '@/lib/errors';
import { fieldError, FormMessage } from './form-message';

const OPTIONS = [
  { value: 'metric', label: 'Metric', example: 'kg, g, litres, m², cm' },
  { value: 'imperial', label: 'Imperial', example: 'lb, oz, gallons, ft², inches' },
] as const;

/** Units preference: two large radio options and a save button. */
export function UnitsForm({ units }: { units: 'metric' | 'imperial' }) {
  const [state, action, pending] = useActionState<ActionState, FormData>(saveUnits, { ok: false });
  const error = fieldError(state, 'units');
  return (
    <form action={action} className="space-y-3">
      <fieldset className="space-y-2" aria-describedby={error ? 'units-error' : undefined}>
        <legend className="font-semibold">Show doses and areas in</legend>
        {OPTIONS.map((o) => (
          <label key={o.value} className="flex min-h-touch cursor-pointer items-center gap-3 rounded-md border border-line-strong bg-surface-raised px-3 py-2">
            <input type="radio" name="units" value={o.value} defaultChecked={units === o.value} className="size-5 accent-accent" />
            <span>
              <span className="font-semibold">{o.label}</span> <span className="text-ink-muted">({o.example})</span>
            </span>
          </label>
        ))}
        {error ? (
          <p id="units-error" className="text-sm font-semibold text-danger">
            {error}
          </p>
        ) : null}
      </fieldset>
      <Button type="submit" disabled={pending}>
        {pending ? 'Saving…' : 'Save units'}
      </Button>
      <FormMessage state={state} />
    </form>
  );
}
