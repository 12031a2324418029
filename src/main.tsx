import './styles/index.css';

// A deployment replaced the build while this page was open: a chunk it asks for is gone (the server answers
// 404, never the page). Reload once into the new build rather than run a mix of old and new files; not
// offline (nothing newer to get) and not twice in a row (the route's error page then says what failed).
window.addEventListener('vite:preloadError', (event) => {
  const key = 'tw-reloaded-for-new-build';
  if (!navigator.onLine || Date.now() - Number(sessionStorage.getItem(key) ?? 0) < 30_000) return;
  sessionStorage.setItem(key, String(Date.now()));
  event.preventDefault();
  window.location.reload();
});

// A page the server already drew is painted before the app's code is evaluated: on a slow phone that
// evaluation takes longer than the paint. Everything else starts at once (the server preloads the chunk).
const prerendered = document.getElementById('tw-initial-data') !== null;
const afterFirstPaint = () => new Promise<void>((resolve) => requestAnimationFrame(() => setTimeout(resolve, 0)));

void (prerendered ? afterFirstPaint() : Promise.resolve()).then(() => import('./app/start')).then((m) => m.start());
