import { lazy, Suspense, useEffect, useSyncExternalStore, type ReactNode } from 'react';
// Types only: the package's code loads on demand (below), never with the first page.
import type { ExternalToast, ToasterProps } from 'sonner';

/**
 * The app's one way to show a toast (ESLint bans importing `sonner` anywhere else). The package is
 * not part of any page's first code: it loads with the first toast (which follows something the reader
 * did, so a first-paint reader never downloads it). The toaster mounts first and the toast is raised
 * once it listens, so the live region exists before its first message (screen readers announce it).
 *
 * Placement: top-centre on phones, so a toast never covers the bottom rows of a table (where a saved
 * row or a failed upload usually is); bottom-right on wider screens, out of the reading column.
 */
type Sonner = typeof import('sonner');
let sonner: Promise<Sonner> | null = null;
const loadSonner = () => (sonner ??= import('sonner'));

// The toaster has mounted and listens: sonner drops toasts raised before its Toaster subscribed.
let markMounted: () => void = () => undefined;
const mounted = new Promise<void>((resolve) => (markMounted = resolve));

let wanted = false;
const wantedListeners = new Set<() => void>();
function wantToaster() {
  if (wanted) return;
  wanted = true;
  wantedListeners.forEach((l) => l());
}

type Kind = 'success' | 'error';
export type ToastOptions = Pick<ExternalToast, 'description' | 'duration' | 'id'>;

function show(kind: Kind, message: ReactNode, options?: ToastOptions) {
  wantToaster();
  void loadSonner()
    .then((m) => mounted.then(() => m.toast[kind](message, options)))
    .catch(() => undefined); // the chunk could not load (offline, stale build): the page itself still says what happened
}

export const toast = {
  success: (message: ReactNode, options?: ToastOptions) => show('success', message, options),
  error: (message: ReactNode, options?: ToastOptions) => show('error', message, options),
};

const PHONE = '(max-width: 639px)';
function useIsPhone(): boolean {
  return useSyncExternalStore(
    (l) => {
      const mq = window.matchMedia(PHONE);
      mq.addEventListener('change', l);
      return () => mq.removeEventListener('change', l);
    },
    () => window.matchMedia(PHONE).matches,
    () => false,
  );
}

const LazyToaster = lazy(() =>
  loadSonner().then((m) => ({
    default: function MountedToaster(props: ToasterProps) {
      // A parent's effect runs after its children's: the Toaster has subscribed by now.
      useEffect(() => markMounted(), []);
      return <m.Toaster {...props} />;
    },
  })),
);

/** Where toasts appear; rendered once, by the app provider. Draws nothing before the first toast. */
export function Toasts() {
  const isWanted = useSyncExternalStore(
    (l) => {
      wantedListeners.add(l);
      return () => wantedListeners.delete(l);
    },
    () => wanted,
    () => false,
  );
  const phone = useIsPhone();
  if (!isWanted) return null;
  return (
    <Suspense fallback={null}>
      <LazyToaster position={phone ? 'top-center' : 'bottom-right'} toastOptions={{ className: 'font-sans' }} />
    </Suspense>
  );
}
