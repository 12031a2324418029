import { lazy, Suspense, useEffect, useSyncExternalStore, type ReactNode } from 'react';
// Types only: the package's code loads on demand (below), never with the first page.
import type { ExternalToast, ToasterProps } from 'sonner';

/**
 * The app's one way to show a toast (ESLint bans importing `sonner` anywhere else). The package is
 * not part of any page's first code: it loads with the first toast (which follows something the reader
 * did, so a first-paint reader never downloads it). The toaster mounts first and the toast is raised
 * once it listens, so the live region exists before its first message (screen readers announce it).
 *
 * Placement: bottom-right on wider screens, out of the reading column; on a phone, in the page's flow at
 * the top of the content ({@link InPageToasts}), so a toast never covers a table or a form.
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
    .then((m) => Promise.all([mounted, isPhone() ? phoneMounted : null]).then(() => m.toast[kind](message, options)))
    .catch(() => undefined); // the chunk could not load (offline, stale build): the page itself still says what happened
}

export const toast = {
  success: (message: ReactNode, options?: ToastOptions) => show('success', message, options),
  error: (message: ReactNode, options?: ToastOptions) => show('error', message, options),
};

const PHONE = '(max-width: 639px)';
const isPhone = () => typeof window !== 'undefined' && window.matchMedia(PHONE).matches;
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

function useWanted() {
  return useSyncExternalStore(
    (l) => {
      wantedListeners.add(l);
      return () => wantedListeners.delete(l);
    },
    () => wanted,
    () => false,
  );
}

/** Where toasts appear; rendered once, by the app provider. Draws nothing before the first toast. */
export function Toasts() {
  const isWanted = useWanted();
  const phone = useIsPhone();
  if (!isWanted) return null;
  return (
    <Suspense fallback={null}>
      <LazyToaster position={phone ? 'top-center' : 'bottom-right'} toastOptions={{ className: 'font-sans' }} />
    </Suspense>
  );
}

let markPhoneMounted: () => void = () => undefined;
const phoneMounted = new Promise<void>((resolve) => (markPhoneMounted = resolve));

const LazyPhoneToasts = lazy(() =>
  import('./phone-toasts').then((m) => ({
    default: function MountedPhoneToasts() {
      // As with the toaster: the list has subscribed to sonner's toasts before this effect runs.
      useEffect(() => markPhoneMounted(), []);
      return <m.PhoneToasts />;
    },
  })),
);

/**
 * On a phone, the same messages in the page's flow at the top of the content (the floating stack is hidden
 * below 640 px, src/styles/index.css), so a toast never covers a table or a form. Loaded with the first toast.
 */
export function InPageToasts() {
  const isWanted = useWanted();
  const phone = useIsPhone();
  if (!isWanted || !phone) return null;
  return (
    <Suspense fallback={null}>
      <LazyPhoneToasts />
    </Suspense>
  );
}
