import type { InputHTMLAttributes } from 'react';
import { cx } from './class-names';

export type FieldProps = Omit<InputHTMLAttributes<HTMLInputElement>, 'id' | 'name'> & {
  /** Visible label text. */
  label: string;
  name: string;
  /** Defaults to `field-<name>`; pass one when the same name appears twice on a page. */
  id?: string;
  /** Help text under the label, linked with aria-describedby. */
  hint?: string;
  /** Validation message; marks the input invalid and is announced with it. */
  error?: string;
  className?: string;
};

/** Label + input + optional hint and error, wired for assistive technology. */
export function Field({ label, name, id, hint, error, className, required, ...input }: FieldProps) {
  const inputId = id ?? `field-${name}`;
  const hintId = hint ? `${inputId}-hint` : undefined;
  const errorId = error ? `${inputId}-error` : undefined;
  const describedBy = [hintId, errorId].filter(Boolean).join(' ') || undefined;

  return (
    <div className={cx('flex flex-col gap-1', className)}>
      <label htmlFor={inputId} className="font-semibold text-ink">
        {label}
        {required ? <span className="font-normal text-ink-muted"> (required)</span> : null}
      </label>
      {hint ? (
        <p id={hintId} className="text-sm text-ink-muted">
          {hint}
        </p>
      ) : null}
      <input
        id={inputId}
        name={name}
        required={required}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
        className={cx(
          'min-h-touch w-full rounded-md border bg-surface-raised px-3 text-base text-ink',
          'placeholder:text-ink-muted',
          error ? 'border-danger border-2' : 'border-line-strong',
        )}
        {...input}
      />
      {error ? (
        <p id={errorId} className="text-sm font-semibold text-danger">
          {error}
        </p>
      ) : null}
    </div>
  );
}
