import type { ActionState } from '@/lib/errors';
import { cx } from '@/components/ui/class-names';

/** The message a server action returned: a success note or an alert. */
export function FormMessage({ state, className }: { state: ActionState | null | undefined; className?: string }) {
  if (!state?.message) return null;
  return (
    <p
      role={state.ok ? 'status' : 'alert'}
      className={cx(
        'rounded-md border-2 p-3',
        state.ok ? 'border-verdict-feed bg-verdict-feed-soft text-ink' : 'border-danger bg-verdict-avoid-soft text-ink',
        className,
      )}
    >
      {state.message}
    </p>
  );
}

/** The first message for a field, if any. */
export function fieldError(state: ActionState | null | undefined, name: string): string | undefined {
  return state?.fieldErrors?.[name]?.[0];
}
