import type { ReactNode } from 'react';

type Tone = 'info' | 'caution' | 'danger' | 'ok';
const tones: Record<Tone, string> = {
  info: 'border-ink/20 bg-paper-card text-ink',
  caution: 'border-caution-line bg-caution-wash text-ink',
  danger: 'border-danger-line bg-danger-wash text-ink',
  ok: 'border-ok-line bg-ok-wash text-ink',
};
// Plain text symbols, not emoji: they render in any font and keep to the notebook's ink colours.
const marks: Record<Tone, string> = { info: 'ℹ', caution: '⚠', danger: '✖', ok: '✓' };

/** A boxed message: cautions, errors, confirmations. */
export function Notice({ tone = 'info', title, children, className = '' }: { tone?: Tone; title?: ReactNode; children?: ReactNode; className?: string }) {
  return (
    <div role={tone === 'danger' ? 'alert' : 'note'} className={`flex gap-3 rounded-md border px-4 py-3 ${tones[tone]} ${className}`}>
      <span aria-hidden className="mt-0.5 text-lg leading-none">
        {marks[tone]}
      </span>
      <div className="min-w-0 flex-1 text-sm leading-6">
        {title && <p className="font-semibold">{title}</p>}
        {children}
      </div>
    </div>
  );
}
