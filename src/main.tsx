import './styles/index.css';

// A page the server already drew is painted before the app's code is evaluated: on a slow phone that
// evaluation takes longer than the paint. Everything else starts at once (the server preloads the chunk).
const prerendered = document.getElementById('tw-initial-data') !== null;
const afterFirstPaint = () => new Promise<void>((resolve) => requestAnimationFrame(() => setTimeout(resolve, 0)));

void (prerendered ? afterFirstPaint() : Promise.resolve()).then(() => import('./app/start')).then((m) => m.start());
