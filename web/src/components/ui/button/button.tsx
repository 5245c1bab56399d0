import type { ComponentPropsWithRef } from 'react';

type Variant = 'primary' | 'secondary' | 'quiet' | 'danger';

const variants: Record<Variant, string> = {
  primary:
    'bg-accent text-paper-sheet border-accent hover:bg-accent-strong hover:border-accent-strong',
  secondary: 'bg-paper-sheet text-ink border-rule-strong hover:bg-paper-deep',
  quiet: 'bg-transparent text-accent-strong border-transparent hover:bg-accent-soft',
  danger: 'bg-paper-sheet text-fail border-fail hover:bg-fail-soft',
};

// React 19 passes `ref` as a prop, so callers can focus the button.
export type ButtonProps = ComponentPropsWithRef<'button'> & {
  variant?: Variant;
  busy?: boolean;
};

export function Button({
  variant = 'primary',
  busy = false,
  className = '',
  disabled,
  children,
  type = 'button',
  ...rest
}: ButtonProps) {
  return (
    <button
      type={type}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      className={`inline-flex items-center gap-2 rounded-sm border px-3 py-1.5 text-sm font-medium transition-colors disabled:cursor-not-allowed disabled:opacity-60 ${variants[variant]} ${className}`}
      {...rest}
    >
      {busy ? (
        <span
          aria-hidden="true"
          className="size-3 animate-spin rounded-full border-2 border-current border-t-transparent"
        />
      ) : null}
      {children}
    </button>
  );
}
