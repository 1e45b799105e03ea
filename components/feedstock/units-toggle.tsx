'use client';

import { useActionState, useOptimistic, useTransition } from 'react';
import { setUnitsAction } from '@/app/preferences/actions';
import type { ActionState } from '@/lib/errors';
import type { Units } from '@/lib/format';
import { cx } from '@/components/ui/class-names';

const OPTIONS: { value: Units; label: string }[] = [
  { value: 'metric', label: 'kg/m²' },
  { value: 'imperial', label: 'lb/ft²' },
];

/** Metric / imperial switch for loads. A plain form post without JavaScript; instant with it. */
export function UnitsToggle({ units }: { units: Units }) {
  const [shown, setShown] = useOptimistic(units);
  const [, start] = useTransition();
  const [, formAction] = useActionState<ActionState, FormData>(setUnitsAction, { ok: false });
  return (
    <form
      action={formAction}
      onSubmit={(e) => {
        const submitter = (e.nativeEvent as SubmitEvent).submitter as HTMLButtonElement | null;
        const next = submitter?.value as Units | undefined;
        if (!next) return;
        e.preventDefault();
        const data = new FormData();
        data.set('units', next);
        start(async () => {
          setShown(next);
          await setUnitsAction({ ok: false }, data);
        });
      }}
      className="inline-flex items-center gap-2"
    >
      <span id="units-toggle-label" className="text-sm font-semibold">
        Loads in
      </span>
      <span role="group" aria-labelledby="units-toggle-label" className="inline-flex overflow-hidden rounded-md border border-line-strong">
        {OPTIONS.map((o) => (
          <button
            key={o.value}
            type="submit"
            name="units"
            value={o.value}
            aria-pressed={shown === o.value}
            className={cx(
              'min-h-touch px-3 text-sm font-semibold',
              shown === o.value ? 'bg-accent text-accent-ink' : 'bg-surface-raised text-ink hover:bg-surface-sunken',
            )}
          >
            {o.label}
          </button>
        ))}
      </span>
    </form>
  );
}
