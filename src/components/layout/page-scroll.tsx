import { useLayoutEffect, useRef } from 'react';
import { useLocation, useNavigationType, type Location } from 'react-router-dom';

const STORAGE_KEY = 'tw-scroll-positions';
/** How long a restore or an anchor waits for the page to grow tall enough (data still loading, cards mounting). */
const SETTLE_MS = 4000;

function readSaved(): Record<string, number> {
  try {
    const raw = sessionStorage.getItem(STORAGE_KEY);
    const parsed: unknown = raw ? JSON.parse(raw) : null;
    return parsed && typeof parsed === 'object' ? (parsed as Record<string, number>) : {};
  } catch {
    return {};
  }
}

/** Scroll positions by history entry (React Router's location key), kept for Back/Forward and reloads. */
const positions: Record<string, number> = typeof window === 'undefined' ? {} : readSaved();

function persist() {
  try {
    // Only the most recent entries: the session store is small and shared with the rest of the app.
    const keys = Object.keys(positions);
    for (const k of keys.slice(0, Math.max(0, keys.length - 200))) delete positions[k];
    sessionStorage.setItem(STORAGE_KEY, JSON.stringify(positions));
  } catch {
    // Private mode or a full store: Back still works within this page's life.
  }
}

let stopPending: (() => void) | null = null;

/**
 * Keeps trying `attempt` while the page changes (a query resolving, a lazy card mounting) until it reports
 * success, the reader scrolls or types themselves, or SETTLE_MS passes. One pending attempt at a time.
 */
function settle(attempt: () => boolean) {
  stopPending?.();
  if (attempt()) return;
  const observer = new MutationObserver(() => attempt() && stop());
  const resize = new ResizeObserver(() => attempt() && stop());
  const timer = window.setTimeout(() => stop(), SETTLE_MS);
  const byReader = () => stop();
  const events = ['wheel', 'touchstart', 'keydown', 'mousedown'] as const;
  function stop() {
    observer.disconnect();
    resize.disconnect();
    window.clearTimeout(timer);
    for (const e of events) window.removeEventListener(e, byReader, true);
    if (stopPending === stop) stopPending = null;
  }
  observer.observe(document.body, { childList: true, subtree: true });
  resize.observe(document.documentElement);
  for (const e of events) window.addEventListener(e, byReader, { capture: true, passive: true });
  stopPending = stop;
}

function restoreTo(y: number) {
  // Reaching y once is not enough: a card or list above may still be growing to the height it had when the
  // reader left (the browser's scroll anchoring would then carry them past their place). Hold y until the
  // page settles or the reader scrolls.
  settle(() => {
    if (Math.abs(window.scrollY - y) >= 1) window.scrollTo(0, y);
    return false;
  });
}

function toAnchor(hash: string) {
  let id = hash.slice(1);
  try {
    id = decodeURIComponent(id);
  } catch {
    // keep it as typed
  }
  // Cards and images above the section keep arriving after it first exists, so keep it in place until the
  // page settles (or the reader takes over), not only once.
  settle(() => {
    const el = document.getElementById(id);
    if (el) el.scrollIntoView();
    return false;
  });
}

/**
 * Where the page is scrolled to when the location changes (React Router's own <ScrollRestoration> restores
 * once, at the end of the navigation, before our pages have their data; and it would jump a server-drawn
 * page the reader has started scrolling back to the top when the app takes it over):
 * - a followed link opens its page at the top, or at its #anchor;
 * - Back and Forward return to the exact place, waiting for the page to be tall enough again;
 * - a reload returns to where the reader was;
 * - changing only the query on the same page with `replace` (list filters) leaves the scroll alone.
 */
export function PageScroll() {
  const location = useLocation();
  const navigationType = useNavigationType();
  const previous = useRef<Location | null>(null);

  // Remember the position of the current entry as the reader scrolls, and just before anything navigates.
  useLayoutEffect(() => {
    const key = location.key;
    const save = () => {
      positions[key] = window.scrollY;
    };
    const hide = () => {
      save();
      persist();
      window.history.scrollRestoration = 'auto';
    };
    window.addEventListener('scroll', save, { passive: true });
    document.addEventListener('click', save, true);
    window.addEventListener('pagehide', hide);
    return () => {
      window.removeEventListener('scroll', save);
      document.removeEventListener('click', save, true);
      window.removeEventListener('pagehide', hide);
    };
  }, [location.key]);

  useLayoutEffect(() => {
    const before = previous.current;
    previous.current = location;
    const saved = positions[location.key];
    if (!before) {
      window.history.scrollRestoration = 'manual';
      // A page the server drew has been on screen, and perhaps scrolled, before the app took it over: stay there.
      // (An address with an anchor is taken to its section again: the app's page may lay out differently.)
      if (location.hash) return toAnchor(location.hash);
      const serverDrawn = document.getElementById('tw-initial-data') !== null && window.scrollY > 0;
      if (serverDrawn) return;
      if (saved !== undefined) restoreTo(saved);
      return;
    }
    if (before.key === location.key) return;
    if (navigationType === 'POP') {
      if (saved !== undefined) restoreTo(saved);
      else if (location.hash) toAnchor(location.hash);
      return;
    }
    if (location.hash) return toAnchor(location.hash);
    // A list filter rewriting the query of the page the reader is on.
    if (navigationType === 'REPLACE' && before.pathname === location.pathname) return;
    stopPending?.();
    window.scrollTo(0, 0);
  }, [location, navigationType]);

  return null;
}
