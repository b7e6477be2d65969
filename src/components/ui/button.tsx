import type { ButtonHTMLAttributes, ReactNode } from 'react';
import { Link, type LinkProps } from 'react-router-dom';
import { cn } from '@/lib/cn';
import { Spinner } from './spinner';

export type ButtonVariant = 'primary' | 'secondary' | 'danger' | 'ghost';

// 44 px minimum height: a gloved thumb in a cab, a tablet on a tailgate.
const base =
  'inline-flex min-h-11 items-center justify-center gap-2 rounded-lg px-4 py-2 text-base font-semibold ' +
  'transition-colors disabled:cursor-not-allowed disabled:opacity-60';

const variants: Record<ButtonVariant, string> = {
  primary: 'bg-ink-800 text-white hover:bg-ink-700 active:bg-ink-900',
  secondary: 'border border-loam-500 bg-white text-ink-900 hover:bg-loam-100',
  danger: 'bg-brick-700 text-white hover:bg-brick-600',
  ghost: 'text-ink-800 hover:bg-ink-100',
};

export function buttonClasses(variant: ButtonVariant = 'primary', className?: string): string {
  return cn(base, variants[variant], className);
}

interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: ButtonVariant;
  /** Shows a spinner, keeps the label, and blocks a second press. */
  busy?: boolean;
  children: ReactNode;
}

export function Button({
  variant = 'primary',
  busy = false,
  className,
  disabled,
  children,
  type = 'button',
  onClick,
  'aria-disabled': ariaDisabled,
  ...rest
}: ButtonProps) {
  return (
    <button
      {...rest}
      type={type}
      className={buttonClasses(variant, cn(busy && 'cursor-progress opacity-80', className))}
      // While busy the button stays focusable (a disabled button would drop keyboard focus to the
      // page); it only ignores presses, including the form submit they would trigger.
      disabled={disabled}
      aria-disabled={busy || ariaDisabled || undefined}
      aria-busy={busy || undefined}
      onClick={busy ? (event) => event.preventDefault() : onClick}
    >
      {busy && <Spinner className="size-4" />}
      {children}
    </button>
  );
}

export function ButtonLink({ variant = 'secondary', className, ...rest }: LinkProps & { variant?: ButtonVariant }) {
  return <Link className={buttonClasses(variant, className)} {...rest} />;
}
