import { useEffect, useState } from 'react';
import { toast as sonner, useSonner } from 'sonner';

const DEFAULT_MS = 4000;
const TONES: Record<string, string> = {
  success: 'border-ok-line bg-ok-wash',
  error: 'border-danger-line bg-danger-wash',
  warning: 'border-caution-line bg-caution-wash',
};

/**
 * On a phone the floating toasts would sit on top of what the person is reading (a comparison table,
 * a form). Below the sm breakpoint the floating stack is hidden (src/styles/index.css) and the same
 * messages are shown here instead, in the page's flow at the top of the content: they push the page
 * down instead of covering it, and go after the toast's own time or a tap on Dismiss.
 */
export function PhoneToasts() {
  const { toasts } = useSonner();
  const [gone, setGone] = useState<ReadonlySet<string | number>>(new Set());
  const live = toasts.filter((t) => !gone.has(t.id) && t.type !== 'loading' && (typeof t.title === 'string' || typeof t.title === 'number'));

  useEffect(() => {
    const timers = live.map((t) =>
      setTimeout(() => setGone((g) => new Set(g).add(t.id)), typeof t.duration === 'number' && Number.isFinite(t.duration) ? t.duration : DEFAULT_MS),
    );
    return () => timers.forEach(clearTimeout);
    // Re-armed when the set of shown toasts changes.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [live.map((t) => t.id).join(',')]);

  if (live.length === 0) return null;
  return (
    <div className="mb-4 flex flex-col gap-2 sm:hidden" data-testid="phone-toasts">
      {live.slice(0, 3).map((t) => (
        <div
          key={t.id}
          role={t.type === 'error' ? 'alert' : 'status'}
          className={`flex items-start gap-3 rounded-md border px-3 py-2 text-sm text-ink ${TONES[t.type ?? ''] ?? 'border-ink/20 bg-paper-card'}`}
        >
          <p className="min-w-0 flex-1">{String(t.title)}</p>
          <button
            type="button"
            className="rounded px-1.5 text-xs text-ink-muted underline"
            onClick={() => {
              setGone((g) => new Set(g).add(t.id));
              sonner.dismiss(t.id);
            }}
          >
            Dismiss
          </button>
        </div>
      ))}
    </div>
  );
}
