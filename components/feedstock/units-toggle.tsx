'use client';

import { useSyncExternalStore } from 'react';
import type { Units } from '@/lib/format';
import { UNITS_COOKIE, UNITS_COOKIE_MAX_AGE } from '@/lib/units-cookie';
import { cx } from '@/components/ui/class-names';

const OPTIONS: { value: Units; label: string }[] = [
  { value: 'metric', label: 'kg/m²' },
  { value: 'imperial', label: 'lb/ft²' },
];

const listeners = new Set<() => void>();

function subscribe(listener: () => void) {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

const current = (): Units => (document.documentElement.dataset.units === 'imperial' ? 'imperial' : 'metric');

/** Keeps the choice in the `units` cookie for a year and shows it at once (CSS follows <html data-units>). */
function choose(units: Units) {
  document.cookie = `${UNITS_COOKIE}=${units}; path=/; max-age=${UNITS_COOKIE_MAX_AGE}; samesite=lax`;
  document.documentElement.dataset.units = units;
  for (const l of listeners) l();
}

/**
 * Metric / imperial switch for loads. Every load on the page is in the HTML in
 * both units (components/feedstock/load.tsx); this only flips which one shows,
 * so the page itself is the same for every reader and can be cached. Needs
 * JavaScript; without it both units show and the switch is hidden (globals.css).
 */
export function UnitsToggle() {
  const shown = useSyncExternalStore<Units>(subscribe, current, () => 'metric');
  return (
    <div className="units-toggle inline-flex items-center gap-2">
      <span id="units-toggle-label" className="text-sm font-semibold">
        Loads in
      </span>
      <span role="group" aria-labelledby="units-toggle-label" className="inline-flex overflow-hidden rounded-md border border-line-strong">
        {OPTIONS.map((o) => (
          <button
            key={o.value}
            type="button"
            aria-pressed={shown === o.value}
            onClick={() => choose(o.value)}
            className={cx(
              'min-h-touch px-3 text-sm font-semibold',
              shown === o.value ? 'bg-accent text-accent-ink' : 'bg-surface-raised text-ink hover:bg-surface-sunken',
            )}
          >
            {o.label}
          </button>
        ))}
      </span>
    </div>
  );
}
