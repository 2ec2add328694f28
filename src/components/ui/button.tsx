import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'danger' | 'quiet';

const variants: Record<Variant, string> = {
  primary:
    'bg-spruce-600 text-paper-raised hover:bg-spruce-700 disabled:bg-spruce-200 disabled:text-spruce-700',
  secondary: 'bg-paper-raised text-spruce-700 border border-line-strong hover:bg-spruce-50',
  danger: 'bg-danger-600 text-paper-raised hover:bg-danger-700',
  quiet: 'bg-transparent text-spruce-700 underline-offset-4 hover:underline',
};

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: Variant;
  busy?: boolean;
}

/** At least 44 px tall so it works under a thumb on a phone or tablet. */
export function Button({
  variant = 'primary',
  busy = false,
  className = '',
  children,
  disabled,
  ...rest
}: ButtonProps) {
  return (
    <button
      type="button"
      {...rest}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      className={`inline-flex min-h-touch items-center justify-center gap-2 whitespace-nowrap rounded-control px-4 font-medium transition-colors disabled:cursor-not-allowed ${variants[variant]} ${className}`}
    >
      {busy ? (
        <span
          aria-hidden
          className="size-4 animate-spin rounded-full border-2 border-current border-t-transparent"
        />
      ) : null}
      {children}
    </button>
  );
}
