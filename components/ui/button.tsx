import type { ButtonHTMLAttributes } from 'react';
import { cx } from './class-names';

export type ButtonVariant = 'primary' | 'secondary' | 'quiet' | 'danger';
export type ButtonSize = 'md' | 'lg';

const base =
  'inline-flex items-center justify-center gap-2 rounded-md font-semibold no-underline ' +
  'transition-colors disabled:cursor-not-allowed disabled:opacity-60';

const variants: Record<ButtonVariant, string> = {
  primary: 'bg-accent text-accent-ink hover:bg-accent-strong hover:text-accent-ink',
  secondary:
    'border border-line-strong bg-surface-raised text-ink hover:bg-surface-sunken hover:text-ink',
  quiet: 'text-accent hover:bg-accent-soft hover:text-accent-strong',
  danger: 'border border-danger bg-surface-raised text-danger hover:bg-verdict-avoid-soft',
};

// Both sizes meet the 44 px touch-target minimum.
const sizes: Record<ButtonSize, string> = {
  md: 'min-h-touch px-4 text-base',
  lg: 'min-h-12 px-6 text-lg',
};

/** Class string shared by <Button> and <LinkButton>. */
export function buttonClasses(
  variant: ButtonVariant = 'primary',
  size: ButtonSize = 'md',
  className?: string,
): string {
  return cx(base, variants[variant], sizes[size], className);
}

export type ButtonProps = ButtonHTMLAttributes<HTMLButtonElement> & {
  variant?: ButtonVariant;
  size?: ButtonSize;
};

/** A button; `type` defaults to "button" so it never submits a form by accident. */
export function Button({ variant, size, className, type = 'button', ...rest }: ButtonProps) {
  return <button type={type} className={buttonClasses(variant, size, className)} {...rest} />;
}
