import type { ReactNode, SelectHTMLAttributes, TextareaHTMLAttributes } from 'react';
import { cx } from '@/components/ui/class-names';

/*
 * Form controls for the trial and check-in forms: labelled, with hint and
 * error wired through aria-describedby, large enough for a thumb (44 px).
 * Server-safe (no state); the forms that use them are client components.
 */

/** Border, height and type of a control; width is up to the caller. */
const boxClass = (error?: string) =>
  cx('min-h-touch rounded-md border bg-surface-raised px-3 text-base text-ink', error ? 'border-2 border-danger' : 'border-line-strong');
const controlClass = (error?: string) => cx(boxClass(error), 'w-full');

/** Ids of a control's hint and error, for aria-describedby. */
function describedBy(id: string, hasHint: unknown, hasError: unknown) {
  return [hasHint ? `${id}-hint` : null, hasError ? `${id}-error` : null].filter(Boolean).join(' ') || undefined;
}

function Hint({ id, hint }: { id: string; hint?: ReactNode }) {
  return hint ? (
    <p id={`${id}-hint`} className="text-sm text-ink-muted">
      {hint}
    </p>
  ) : null;
}

/** The error under a control; announced with it through aria-describedby. */
export function FieldError({ id, error }: { id: string; error?: string }) {
  return error ? (
    <p id={`${id}-error`} className="text-sm font-semibold text-danger">
      {error}
    </p>
  ) : null;
}

/** Id of the control for a form field name ("dose.amount" → "f-dose-amount"). */
export function controlId(name: string): string {
  return `f-${name.replace(/[^a-zA-Z0-9]+/g, '-')}`;
}

export type Option = { value: string; label: string };

/** Options from a label map, in the map's order. */
export function optionsFromLabels<K extends string>(labels: Readonly<Record<K, string>>): Option[] {
  return (Object.keys(labels) as K[]).map((value) => ({ value, label: labels[value] }));
}

export type SelectFieldProps = Omit<SelectHTMLAttributes<HTMLSelectElement>, 'id' | 'name'> & {
  label: string;
  name: string;
  options: readonly Option[];
  hint?: string;
  error?: string;
  /** Offer an empty first option with this text. */
  placeholder?: string;
  className?: string;
};

/** A labelled native select. */
export function SelectField({ label, name, options, hint, error, placeholder, className, required, ...rest }: SelectFieldProps) {
  const id = controlId(name);
  return (
    <div className={cx('flex flex-col gap-1', className)}>
      <label htmlFor={id} className="font-semibold">
        {label}
        {required ? <span className="font-normal text-ink-muted"> (required)</span> : null}
      </label>
      <Hint id={id} hint={hint} />
      <select
        id={id}
        name={name}
        required={required}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, hint, error)}
        className={controlClass(error)}
        {...rest}
      >
        {placeholder !== undefined ? <option value="">{placeholder}</option> : null}
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      <FieldError id={id} error={error} />
    </div>
  );
}

export type TextareaFieldProps = Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, 'id' | 'name'> & {
  label: string;
  name: string;
  hint?: ReactNode;
  error?: string;
  className?: string;
};

/** A labelled multi-line text box. */
export function TextareaField({ label, name, hint, error, className, ...rest }: TextareaFieldProps) {
  const id = controlId(name);
  return (
    <div className={cx('flex flex-col gap-1', className)}>
      <label htmlFor={id} className="font-semibold">
        {label}
      </label>
      <Hint id={id} hint={hint} />
      <textarea
        id={id}
        name={name}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(id, hint, error)}
        className={cx(controlClass(error), 'min-h-28 py-2')}
        {...rest}
      />
      <FieldError id={id} error={error} />
    </div>
  );
}

export type QuantityFieldProps = {
  label: string;
  /** Field name prefix: posts `<name>.amount` and `<name>.unit`. */
  name: string;
  units: readonly Option[] | readonly { group: string; options: readonly Option[] }[];
  defaultAmount?: string;
  defaultUnit?: string;
  hint?: string;
  /** Errors keyed by field name ("dose.amount", "dose.unit"). */
  errors: Record<string, string[] | undefined>;
  required?: boolean;
  className?: string;
};

/** An amount with its unit: a decimal input and a unit select side by side, in one fieldset. */
export function QuantityField({ label, name, units, defaultAmount, defaultUnit, hint, errors, required, className }: QuantityFieldProps) {
  const amountId = controlId(`${name}.amount`);
  const unitId = controlId(`${name}.unit`);
  const amountError = errors[`${name}.amount`]?.[0] ?? errors[name]?.[0];
  const unitError = errors[`${name}.unit`]?.[0];
  const grouped = units.length > 0 && 'group' in units[0];
  return (
    <fieldset className={cx('flex min-w-0 flex-col gap-1', className)}>
      <legend className="mb-1 font-semibold">
        {label}
        {required ? <span className="font-normal text-ink-muted"> (required)</span> : null}
      </legend>
      <Hint id={amountId} hint={hint} />
      <div className="flex gap-2">
        <label htmlFor={amountId} className="sr-only">
          {label}: amount
        </label>
        <input
          id={amountId}
          name={`${name}.amount`}
          type="text"
          inputMode="decimal"
          autoComplete="off"
          defaultValue={defaultAmount}
          required={required}
          aria-invalid={amountError ? true : undefined}
          aria-describedby={describedBy(amountId, hint, amountError)}
          className={cx(boxClass(amountError), 'w-full min-w-0 flex-1')}
        />
        <label htmlFor={unitId} className="sr-only">
          {label}: unit
        </label>
        <select
          id={unitId}
          name={`${name}.unit`}
          defaultValue={defaultUnit}
          aria-invalid={unitError ? true : undefined}
          aria-describedby={unitError ? `${unitId}-error` : undefined}
          className={cx(boxClass(unitError), 'min-w-24 max-w-[45%] flex-none')}
        >
          {grouped
            ? (units as readonly { group: string; options: readonly Option[] }[]).map((g) => (
                <optgroup key={g.group} label={g.group}>
                  {g.options.map((o) => (
                    <option key={o.value} value={o.value}>
                      {o.label}
                    </option>
                  ))}
                </optgroup>
              ))
            : (units as readonly Option[]).map((o) => (
                <option key={o.value} value={o.value}>
                  {o.label}
                </option>
              ))}
        </select>
      </div>
      <FieldError id={amountId} error={amountError} />
      <FieldError id={unitId} error={unitError} />
    </fieldset>
  );
}

/** A large checkbox with its label, for a thumb. */
export function CheckboxField({ label, name, value, defaultChecked, hint }: { label: ReactNode; name: string; value?: string; defaultChecked?: boolean; hint?: string }) {
  const id = controlId(value ? `${name}-${value}` : name);
  return (
    <div className="flex items-start gap-3">
      <input
        id={id}
        type="checkbox"
        name={name}
        value={value ?? 'on'}
        defaultChecked={defaultChecked}
        aria-describedby={hint ? `${id}-hint` : undefined}
        className="mt-1 size-6 shrink-0 accent-accent"
      />
      <div>
        <label htmlFor={id} className="flex min-h-touch items-start pt-0.5">
          {label}
        </label>
        <Hint id={id} hint={hint} />
      </div>
    </div>
  );
}

/** Lists every field error at the top of a form, each linking to its control. */
export function ErrorSummary({ errors, labels, message }: { errors: Record<string, string[] | undefined>; labels: Record<string, string>; message?: string }) {
  const entries = Object.entries(errors).filter(([, v]) => v && v.length);
  if (!entries.length && !message) return null;
  return (
    <div role="alert" className="rounded-lg border-2 border-danger bg-surface-raised p-4" tabIndex={-1} id="form-errors">
      <p className="font-semibold text-danger">{message ?? 'Some fields need attention.'}</p>
      {entries.length ? (
        <ul className="mt-2 list-disc space-y-1 pl-5">
          {entries.map(([key, msgs]) => (
            <li key={key}>
              {key === '_form' ? (
                msgs![0]
              ) : (
                <a href={`#${controlId(key)}`}>
                  {labels[key] ?? key}: {msgs![0]}
                </a>
              )}
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
