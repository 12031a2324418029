import { StrictMode, useEffect } from 'react';
import { createRoot } from 'react-dom/client';
// Before the router: its loaders must find a pre-rendered page's data already in the cache.
import { initialData } from './seed-from-page';
import { AppProvider } from './provider';
import { AppRouter, router } from './router';
import './nav-extras-setup';
import { keepHeaderSearch } from './carry-over';
import { noteSavedPage } from '@/lib/offline/saved-copy';
import { applyWaitingUpdate, checkForUpdateSoon } from '@/lib/offline/update';

/** Marks the document once the app has drawn itself (a server-drawn page has been replaced by then). */
function Started({ onStarted }: { onStarted: () => void }) {
  useEffect(() => {
    onStarted();
    document.documentElement.dataset.app = 'running';
  }, [onStarted]);
  return null;
}

function render() {
  const restoreSearch = keepHeaderSearch();
  createRoot(document.getElementById('root')!).render(
    <StrictMode>
      <AppProvider>
        <AppRouter />
        <Started onStarted={restoreSearch} />
      </AppProvider>
    </StrictMode>,
  );
}

/**
 * The service worker is registered once the page has loaded and the browser is idle: it then fetches the
 * whole build for offline use, which must not compete with what the reader came for.
 */
function registerWorkerWhenIdle() {
  const go = () => {
    const idle = window.requestIdleCallback ?? ((cb: () => void) => setTimeout(cb, 200));
    idle(() => void import('@/lib/offline/register').then((m) => m.registerServiceWorker()));
  };
  if (document.readyState === 'complete') go();
  else window.addEventListener('load', go, { once: true });
}

/** A new build waiting to take over does so at the next navigation: a whole-page reload, never a mix. Otherwise the navigation may look for one. */
function updateAtNextNavigation() {
  let shown = router.state.location;
  router.subscribe((state) => {
    if (state.navigation.state !== 'idle' || state.location === shown) return;
    shown = state.location;
    if (!applyWaitingUpdate()) checkForUpdateSoon();
  });
}

/** Starts the app in the page. */
export function start() {
  document.documentElement.dataset.build = __TW_BUILD__;
  noteSavedPage();
  registerWorkerWhenIdle();
  updateAtNextNavigation();
  if (initialData && !router.state.initialized) {
    // The server drew this page already: keep its HTML on screen until the route's code is here, then
    // draw the same page from the same data in one go (no spinner in between).
    const unsubscribe = router.subscribe((state) => {
      if (!state.initialized) return;
      unsubscribe();
      render();
    });
  } else {
    render();
  }
}
