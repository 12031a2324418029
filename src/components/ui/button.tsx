import { forwardRef, type ButtonHTMLAttributes } from 'react';

type Variant = 'primary' | 'secondary' | 'ghost' | 'danger';
const styles: Record<Variant, string> = {
  primary: 'bg-copper text-white hover:bg-copper-dark border-copper-dark',
  secondary: 'bg-paper-card text-ink hover:bg-paper-deep border-ink/25',
  ghost: 'bg-transparent text-ink hover:bg-paper-deep border-transparent',
  danger: 'bg-danger text-white hover:brightness-95 border-danger',
};

export type ButtonProps = ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant; pending?: boolean; size?: 'sm' | 'md' };

/** The product's button; `pending` disables it and shows progress. */
export const Button = forwardRef<HTMLButtonElement, ButtonProps>(function Button(
  { variant = 'primary', pending, size = 'md', className = '', children, disabled, ...rest },
  ref,
) {
  const pad = size === 'sm' ? 'px-3 py-1.5 text-sm' : 'px-4 py-2 text-[0.95rem]';
  return (
    <button
      ref={ref}
      className={`inline-flex items-center justify-center gap-2 rounded-md border font-medium shadow-sm transition disabled:cursor-not-allowed disabled:opacity-60 ${pad} ${styles[variant]} ${className}`}
      disabled={disabled || pending}
      aria-busy={pending || undefined}
      {...rest}
    >
      {pending && <span className="h-3.5 w-3.5 animate-spin rounded-full border-2 border-current border-t-transparent" aria-hidden />}
      {children}
    </button>
  );
});
