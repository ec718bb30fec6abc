import type { ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'danger' | 'quiet';

const styles: Record<Variant, string> = {
  primary: 'bg-copper text-white hover:bg-copper-dark border border-copper-dark',
  secondary: 'bg-panel text-ink border border-rule hover:bg-paper',
  danger: 'bg-fail text-white border border-fail hover:brightness-90',
  quiet: 'bg-transparent text-ink-soft hover:text-ink hover:bg-paper border border-transparent',
};

export function Button({
  variant = 'secondary',
  busy = false,
  className = '',
  children,
  disabled,
  ...rest
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant; busy?: boolean }) {
  return (
    <button
      {...rest}
      disabled={disabled || busy}
      aria-busy={busy || undefined}
      className={`inline-flex items-center justify-center gap-2 rounded-md px-3 py-1.5 text-sm font-semibold transition-colors disabled:cursor-not-allowed disabled:opacity-60 ${styles[variant]} ${className}`}
    >
      {busy && <span className="h-3 w-3 animate-spin rounded-full border-2 border-current border-t-transparent" aria-hidden />}
      {children}
    </button>
  );
}
