import type { ActionState } from '@/lib/errors';
import { cx } from '@/components/ui/class-names';

/** The outcome line under a form: announced politely, red for errors, moss for success. */
export function FormMessage({ state, className }: { state: ActionState; className?: string }) {
  return (
    <p aria-live="polite" className={cx('text-sm font-semibold', state.ok ? 'text-accent-strong' : 'text-danger', className)}>
      {state.message ?? null}
    </p>
  );
}

/** The first message for a field, for <Field error>. */
export function fieldError(state: ActionState, name: string): string | undefined {
  return state.fieldErrors?.[name]?.[0];
}
