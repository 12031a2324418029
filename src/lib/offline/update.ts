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

/**
 * Asks the browser to look for a new build (a changed /sw.js). Browsers look on their own only when a page
 * is loaded in full, which an app that navigates in place rarely does; register.ts sets the check and the
 * router asks at in-app navigations and when the tab comes back, at most once every 30 s.
 */
const CHECK_EVERY_MS = 30_000;
let check: (() => void) | null = null;
let lastCheck = 0;
export function setUpdateCheck(fn: () => void) {
  check = fn;
  lastCheck = Date.now();
}
export function checkForUpdateSoon() {
  if (!check || takeOver || Date.now() - lastCheck < CHECK_EVERY_MS) return;
  lastCheck = Date.now();
  check();
}
