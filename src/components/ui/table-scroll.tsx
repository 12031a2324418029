import { useRef, type ReactNode } from 'react';
import { useSidewaysOverflow } from '@/lib/table-scroll';

/**
 * A wide table's frame. When the table is wider than the window (a phone, 200 % zoom) it says so above the
 * table ("scrolls sideways") and the frame becomes a named, focusable region, so a keyboard can scroll it
 * with the arrow keys (WCAG 2.1.1; axe's scrollable-region-focusable). When the table fits, neither shows.
 */
export function TableScroll({ label, className = '', children }: { label: string; className?: string; children: ReactNode }) {
  const ref = useRef<HTMLDivElement>(null);
  const overflow = useSidewaysOverflow(ref);
  return (
    <div className="min-w-0">
      {overflow && (
        <p className="mb-1 flex items-center justify-end gap-1 text-xs text-ink-muted" data-scroll-hint aria-hidden>
          Scrolls sideways
          <span className="font-sans">→</span>
        </p>
      )}
      <div
        ref={ref}
        className={`table-scroll ${className}`}
        tabIndex={overflow ? 0 : undefined}
        role={overflow ? 'region' : undefined}
        aria-label={overflow ? `${label} (scrolls sideways)` : undefined}
      >
        {children}
      </div>
    </div>
  );
}
