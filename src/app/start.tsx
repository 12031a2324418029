import { StrictMode, useEffect } from 'react';
import { createRoot } from 'react-dom/client';
// Before the router: its loaders must find a pre-rendered page's data already in the cache.
import { initialData } from './seed-from-page';
import { AppProvider } from './provider';
import { AppRouter, router } from './router';
import './nav-extras-setup';
import { keepHeaderSearch } from './carry-over';

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

/** Starts the app in the page. */
export function start() {
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
