import { Workbox } from 'workbox-window';
import { checkForUpdateSoon, setUpdateCheck, setUpdateWaiting } from './update';
import { keepOffline } from './worker';

/**
 * Registers the service worker (src/sw.ts, built to /sw.js) once the app runs. A first install takes over
 * the open page at once (it is the same build). A later build installs in the background and waits: the
 * page offers "Reload", and otherwise switches at the reader's next navigation, reloading the whole page
 * so every file it runs comes from one build. Loaded as its own chunk after the app has started.
 */
export function registerServiceWorker() {
  if (!('serviceWorker' in navigator) || !window.isSecureContext) return;
  const wb = new Workbox('/sw.js', { scope: '/', type: 'classic' });
  let reloading = false;
  const takeOver = () => {
    // Reload once the new worker controls the page; it serves the new build's files from then on.
    wb.addEventListener('controlling', () => {
      if (reloading) return;
      reloading = true;
      window.location.reload();
    });
    wb.messageSkipWaiting();
  };
  wb.addEventListener('waiting', () => setUpdateWaiting(takeOver));
  // The page that installed the worker was fetched before it existed: store it now, like every later one.
  wb.addEventListener('controlling', (event) => {
    if (!event.isUpdate) void keepOffline([window.location.pathname + window.location.search], []).catch(() => undefined);
  });
  void wb
    .register()
    .then((registration) => {
      if (!registration) return;
      setUpdateCheck(() => void registration.update().catch(() => undefined));
      document.addEventListener('visibilitychange', () => document.visibilityState === 'visible' && checkForUpdateSoon());
    })
    .catch(() => undefined); // no worker: the app still works, just not offline
}
