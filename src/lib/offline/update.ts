import { useSyncExternalStore } from 'react';

/**
 * A new build's service worker installed and waiting: what takes it over. Set by register.ts; read by the
 * layout (the "new version" notice) and by the router (which applies it at the next navigation).
 */
let takeOver: (() => void) | null = null;
const listeners = new Set<() => void>();

export function setUpdateWaiting(apply: () => void) {
  takeOver = apply;
  listeners.forEach((l) => l());
}

/** Switches to the waiting build now (the page reloads); false when there is none. */
export function applyWaitingUpdate(): boolean {
  if (!takeOver) return false;
  const apply = takeOver;
  takeOver = null;
  listeners.forEach((l) => l());
  apply();
  return true;
}

/** True while a new build waits to take over. */
export function useUpdateWaiting(): boolean {
  return useSyncExternalStore(
    (l) => {
      listeners.add(l);
      return () => listeners.delete(l);
    },
    () => takeOver !== null,
    () => false,
  );
}
