import { Worker } from 'node:worker_threads';
import { boundedBodyDiff, type BodyDiff } from './body-diff';

/**
 * Body diffs of long revisions cost up to a few hundred milliseconds of CPU even within their limits
 * (tokenising 100,000 characters is not free), so they run on one worker thread: the request thread
 * stays free for every other request (health checks included). A diff that takes longer than
 * HARD_LIMIT_MS ends the worker and answers with the coarsest diff; if no worker can be started, the
 * diff runs here, bounded and yielding between passages.
 */
const HARD_LIMIT_MS = 3000;

type Pending = { resolve: (d: BodyDiff) => void; timer: NodeJS.Timeout; from: string; to: string };

let worker: Worker | null = null;
let nextId = 1;
const pending = new Map<number, Pending>();

const whole = (from: string, to: string): BodyDiff => ({
  parts: [...(from ? [{ value: from, removed: true }] : []), ...(to ? [{ value: to, added: true }] : [])],
  detail: 'whole',
});

/** The worker is gone (it failed to start or crashed): what it was working on is done here instead. */
function failAll() {
  for (const [id, p] of pending) {
    clearTimeout(p.timer);
    pending.delete(id);
    void boundedBodyDiff(p.from, p.to).then(p.resolve);
  }
}

function getWorker(): Worker {
  if (worker) return worker;
  // Run from TypeScript (tests, `npm run dev`) the worker is loaded through tsx whatever the parent was started
  // with; in the compiled server (dist-server/, see server/bin/build-server.mjs) it is the built file beside this one.
  const compiled = !import.meta.url.endsWith('.ts');
  const w = compiled
    ? new Worker(new URL('./body-diff-worker.js', import.meta.url))
    : new Worker(new URL('./body-diff-worker.ts', import.meta.url), { execArgv: ['--import', 'tsx'] });
  w.unref();
  w.on('message', (msg: { id: number; ok: boolean; result?: BodyDiff }) => {
    const p = pending.get(msg.id);
    if (!p) return;
    clearTimeout(p.timer);
    pending.delete(msg.id);
    p.resolve(msg.ok && msg.result ? msg.result : whole(p.from, p.to));
  });
  w.on('error', () => {
    if (worker === w) worker = null;
    failAll();
  });
  w.on('exit', () => {
    if (worker === w) worker = null;
    failAll();
  });
  worker = w;
  return w;
}

/** The bounded body diff (see body-diff.ts), worked out off the request thread. */
export function bodyDiffOffThread(from: string, to: string): Promise<BodyDiff> {
  if (from === to || from.length + to.length < 2000) return boundedBodyDiff(from, to);
  let w: Worker;
  try {
    w = getWorker();
  } catch {
    return boundedBodyDiff(from, to);
  }
  return new Promise<BodyDiff>((resolve) => {
    const id = nextId++;
    const timer = setTimeout(() => {
      // Far past its limits: stop it (everything it was working on gets the coarse answer) and start afresh next time.
      pending.delete(id);
      resolve(whole(from, to));
      if (worker === w) worker = null;
      void w.terminate();
    }, HARD_LIMIT_MS);
    pending.set(id, { resolve, timer, from, to });
    w.postMessage({ id, from, to });
  });
}

/** Starts the worker ahead of the first long diff (at server start), so no reader waits for it to load. */
export function warmBodyDiffWorker() {
  try {
    getWorker();
  } catch {
    // Diffs will run on this thread, bounded; nothing to do now.
  }
}

/** Stops the worker (tests, shutdown). */
export async function closeBodyDiffWorker() {
  const w = worker;
  worker = null;
  failAll();
  if (w) await w.terminate();
}
