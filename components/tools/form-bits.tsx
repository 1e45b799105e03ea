import type { ReactNode } from 'react';
import { buttonClasses } from '@/components/ui/button';
import { cx } from '@/components/ui/class-names';

/** A labelled control with its error underneath, for the GET calculator forms (server-rendered). */
export function ToolField({
  id,
  label,
  error,
  hint,
  children,
  className,
}: {
  id: string;
  label: string;
  error?: string;
  hint?: string;
  children: (props: { id: string; 'aria-invalid'?: boolean; 'aria-describedby'?: string }) => ReactNode;
  className?: string;
}) {
  const described = [hint ? `${id}-hint` : null, error ? `${id}-error` : null].filter(Boolean).join(' ') || undefined;
  return (
    <div className={cx('flex flex-col gap-1', className)}>
      <label htmlFor={id} className="font-semibold">
        {label}
      </label>
      {hint ? (
        <p id={`${id}-hint`} className="text-sm text-ink-muted">
          {hint}
        </p>
      ) : null}
      {children({ id, 'aria-invalid': error ? true : undefined, 'aria-describedby': described })}
      {error ? (
        <p id={`${id}-error`} className="text-sm font-semibold text-danger">
          {error}
        </p>
      ) : null}
    </div>
  );
}

export const inputClass = 'min-h-touch w-full rounded-md border border-line-strong bg-surface-raised px-3 text-base text-ink aria-[invalid=true]:border-2 aria-[invalid=true]:border-danger';

/** A number typed as text (decimal keypad on phones), redisplayed as typed. */
export function DecimalField({ id, label, name, value, error, hint }: { id: string; label: string; name: string; value: string; error?: string; hint?: string }) {
  return (
    <ToolField id={id} label={label} error={error} hint={hint}>
      {(p) => <input {...p} name={name} inputMode="decimal" defaultValue={value} className={inputClass} />}
    </ToolField>
  );
}

/** Raw GET value as a string for redisplay. */
export function raw(v: string | string[] | undefined): string {
  return (Array.isArray(v) ? v[0] : v) ?? '';
}

/** The page head of a calculator: its title and what it works out. */
export function ToolHeader({ title, children }: { title: string; children: ReactNode }) {
  return (
    <header className="space-y-2">
      <h1 className="text-3xl">{title}</h1>
      <p className="max-w-prose">{children}</p>
    </header>
  );
}

/** One group of a calculator form, with its legend. */
export function ToolFieldset({ legend, children }: { legend: string; children: ReactNode }) {
  return (
    <fieldset className="space-y-3 rounded-lg border border-line bg-surface-raised p-4">
      <legend className="px-1 font-display text-xl">{legend}</legend>
      {children}
    </fieldset>
  );
}

/** The options of a kilograms / pounds select. */
export function MassUnitOptions() {
  return (
    <>
      <option value="kg">kilograms</option>
      <option value="lb">pounds</option>
    </>
  );
}

/** The calculators' submit button. */
export function ToolSubmit() {
  return (
    <button type="submit" className={buttonClasses('primary', 'lg')}>
      Work it out
    </button>
  );
}

/** A problem with the form, announced at once. */
export function ToolAlert({ children }: { children: ReactNode }) {
  return (
    <p role="alert" className="rounded-md border-2 border-danger bg-verdict-avoid-soft p-3">
      {children}
    </p>
  );
}

/** The alert shown when a submitted form has field errors (each field shows its own message). */
export function FieldErrorsAlert({ show }: { show: boolean }) {
  return show ? <ToolAlert>Some fields need attention: see the messages next to them.</ToolAlert> : null;
}

/** A result section, announced as a status when it appears. */
export function ToolResult({ id, title, className = 'space-y-3', children }: { id: string; title: ReactNode; className?: string; children: ReactNode }) {
  return (
    <section aria-labelledby={id} className={className} role="status">
      <h2 id={id} className="text-2xl">
        {title}
      </h2>
      {children}
    </section>
  );
}

/** The figures of a result, as term / value pairs. */
export function ResultList({ children }: { children: ReactNode }) {
  return <dl className="grid max-w-xl grid-cols-[auto_1fr] gap-x-6 gap-y-1 text-lg">{children}</dl>;
}

/** "How it is worked out": the method and its sources, under a calculator. */
export function ToolMethod({ id, children }: { id: string; children: ReactNode }) {
  return (
    <section aria-labelledby={id} className="max-w-prose space-y-2 text-sm text-ink-muted">
      <h2 id={id} className="text-lg text-ink">
        How it is worked out
      </h2>
      <p>{children}</p>
    </section>
  );
}
