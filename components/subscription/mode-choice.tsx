import type { SubscriptionMode } from '@/lib/validation/subscriptions';

/** How each mode reads on screen. */
export const MODE_LABELS: Readonly<Record<SubscriptionMode, string>> = {
  immediate: 'Each update as it happens',
  digest: 'A weekly digest',
};

const MODE_HINTS: Readonly<Record<SubscriptionMode, string>> = {
  immediate: 'one e-mail per change',
  digest: 'one e-mail a week with everything',
};

/** Two large radio options: each update, or a weekly digest. */
export function ModeChoice({ name, idBase, defaultValue, error }: { name: string; idBase: string; defaultValue: SubscriptionMode; error?: string }) {
  return (
    <fieldset className="space-y-2" aria-describedby={error ? `${idBase}-mode-error` : undefined}>
      <legend className="font-semibold">How often</legend>
      {(['immediate', 'digest'] as const).map((m) => (
        <label key={m} className="flex min-h-touch cursor-pointer items-center gap-3 rounded-md border border-line-strong bg-surface-raised px-3 py-2">
          <input type="radio" name={name} value={m} defaultChecked={defaultValue === m} className="size-5 accent-accent" />
          <span>
            <span className="font-semibold">{MODE_LABELS[m]}</span> <span className="text-ink-muted">({MODE_HINTS[m]})</span>
          </span>
        </label>
      ))}
      {error ? (
        <p id={`${idBase}-mode-error`} className="text-sm font-semibold text-danger">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}
