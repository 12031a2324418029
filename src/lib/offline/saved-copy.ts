import { useSyncExternalStore } from 'react';
import { SAVED_AT_META } from '@shared/offline';

/**
 * Whether the page on screen shows a saved copy, and from when: noted by the API client when the service
 * worker answered from its store, and read from the page itself when the worker served a stored page.
 * Keyed by path, so moving to another page starts clean.
 */
type State = { path: string; savedAt: Date } | null;

let state: State = null;
const listeners = new Set<() => void>();
const emit = () => listeners.forEach((l) => l());

/** Notes that something the page at `path` shows was stored at `savedAt`; the oldest time wins. */
export function noteSavedCopy(savedAt: string | null | undefined, pathname?: string) {
  const at = savedAt ? new Date(savedAt) : null;
  if (!at || Number.isNaN(at.getTime())) return;
  const path = pathname ?? window.location.pathname;
  if (state && state.path === path && state.savedAt <= at) return;
  state = { path, savedAt: at };
  emit();
}

/** A stored page served by the worker says so in its head. Read once, at start. */
export function noteSavedPage(doc: Document = document) {
  const meta = doc.querySelector<HTMLMetaElement>(`meta[name="${SAVED_AT_META}"]`);
  if (meta) noteSavedCopy(meta.content, doc.location?.pathname ?? '/');
}

/** Called when live answers arrive again for a page, so it stops saying it is a saved copy. */
export function clearSavedCopy(path: string = window.location.pathname) {
  if (state?.path !== path) return;
  state = null;
  emit();
}

const subscribe = (l: () => void) => {
  listeners.add(l);
  return () => listeners.delete(l);
};

/** The saved-copy time for `path`, or null when the page shows live answers. */
export function useSavedCopy(path: string): Date | null {
  const s = useSyncExternalStore(
    subscribe,
    () => state,
    () => null,
  );
  return s && s.path === path ? s.savedAt : null;
}
