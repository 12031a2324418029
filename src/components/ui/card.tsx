import type { HTMLAttributes, ReactNode } from 'react';

/** A paper card with a hairline border. */
export function Card({ className = '', children, ...rest }: HTMLAttributes<HTMLDivElement>) {
  return (
    <div className={`rounded-lg border border-paper-line bg-paper-card shadow-[0_1px_0_rgba(29,42,68,0.06)] ${className}`} {...rest}>
      {children}
    </div>
  );
}

/** Title block at the top of a page. */
export function PageHeader({ eyebrow, title, children, actions }: { eyebrow?: ReactNode; title: ReactNode; children?: ReactNode; actions?: ReactNode }) {
  return (
    <header className="mb-6 flex flex-wrap items-end justify-between gap-4 border-b border-paper-line pb-4">
      <div className="min-w-0">
        {eyebrow && <p className="text-xs font-semibold tracking-[0.14em] text-copper uppercase">{eyebrow}</p>}
        <h1 className="mt-1 font-serif text-3xl font-bold text-ink">{title}</h1>
        {children && <div className="mt-2 max-w-3xl text-ink-soft">{children}</div>}
      </div>
      {actions && <div className="flex flex-wrap gap-2">{actions}</div>}
    </header>
  );
}

export function Spinner({ label = 'Loading…' }: { label?: string }) {
  return (
    <div role="status" className="flex items-center gap-2 py-6 text-ink-muted">
      <span className="h-4 w-4 animate-spin rounded-full border-2 border-copper border-t-transparent" aria-hidden />
      {label}
    </div>
  );
}

export function Chip({ children, tone = 'plain' }: { children: ReactNode; tone?: 'plain' | 'copper' | 'ink' }) {
  const t =
    tone === 'copper'
      ? 'bg-copper-wash text-copper-dark border-copper/30'
      : tone === 'ink'
        ? 'bg-ink text-paper border-ink'
        : 'bg-paper-deep text-ink-soft border-paper-line';
  return <span className={`inline-flex items-center rounded-full border px-2.5 py-0.5 text-xs font-medium ${t}`}>{children}</span>;
}
